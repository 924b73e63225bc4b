import { redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/guard';
import { createClass, listClasses } from '$lib/server/classes/classes';
import { refuseForm } from '$lib/server/classes/http';
import { emptyForm, readForm, unreadable } from '$lib/server/forms';
import { classNameSchema } from '$lib/forms/classes';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const user = requireRole('teacher', 'admin');
	const { items } = await listClasses(user, { archived: true });
	return {
		classes: items.filter((c) => c.as === 'teacher'),
		form: await emptyForm(classNameSchema)
	};
};

export const actions: Actions = {
	create: async ({ request }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readForm(request, classNameSchema);
		if (!form) return unreadable(classNameSchema);
		const result = await createClass(user, { name: form.data.name });
		if (!result.ok) return refuseForm(form, result);
		redirect(303, `/teach/classes/${result.class.id}`);
	}
};
