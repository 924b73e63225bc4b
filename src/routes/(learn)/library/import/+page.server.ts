import { fail } from '@sveltejs/kit';
import { superValidate, withFiles } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireUser } from '$lib/server/auth/guard';
import { LibraryError } from '$lib/server/library/errors';
import { importAbcFile, type ImportResult } from '$lib/server/library/import';
import { importSchema } from '$lib/library/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requireUser();
	return { form: await superValidate(zod4(importSchema)) };
};

export const actions: Actions = {
	default: async ({ request }) => {
		const user = requireUser();
		const form = await superValidate(request, zod4(importSchema));
		if (!form.valid) return fail(400, withFiles({ form }));
		let text: string;
		try {
			text = new TextDecoder('utf-8', { fatal: true }).decode(await form.data.file.arrayBuffer());
		} catch {
			form.errors.file = ['The file is not UTF-8 text: save it as a plain .abc text file.'];
			return fail(400, withFiles({ form }));
		}
		let result: ImportResult;
		try {
			result = await importAbcFile(user, text);
		} catch (e) {
			if (!(e instanceof LibraryError)) throw e;
			form.errors.file = [e.message];
			return fail(e.status === 413 ? 413 : 422, withFiles({ form }));
		}
		return withFiles({ form, result, fileName: form.data.file.name });
	}
};
