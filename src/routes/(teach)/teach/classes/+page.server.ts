import { fail, redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/guard';
import { createClass, listClasses } from '$lib/server/classes/classes';
import { readFields } from '$lib/server/classes/http';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const user = requireRole('teacher', 'admin');
	const { items } = await listClasses(user, { archived: true });
	return { classes: items.filter((c) => c.as === 'teacher') };
};

export const actions: Actions = {
	create: async ({ request }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readFields(request);
		const result = await createClass(user, { name: form?.name });
		if (!result.ok) {
			return fail(result.reason === 'invalid' ? 422 : 403, {
				name: form?.name ?? '',
				message: result.message
			});
		}
		redirect(303, `/teach/classes/${result.class.id}`);
	}
};
