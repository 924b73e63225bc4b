import { redirect } from '@sveltejs/kit';
import { checkHealth } from '$lib/server/admin/health';
import { countUsersByRole, listUsers } from '$lib/server/admin/users';
import { ROLES, setRoleSchema } from '$lib/forms/account';
import { requireRole } from '$lib/server/auth/guard';
import { setRole } from '$lib/server/auth/user';
import { emptyForm, readForm, unreadable, refuse, say } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

const USERS_SHOWN = 100;

export const load: PageServerLoad = async ({ url }) => {
	const admin = requireRole('admin');
	const [counts, users, health, roleForm] = await Promise.all([
		countUsersByRole(),
		listUsers({ limit: USERS_SHOWN }),
		checkHealth(),
		emptyForm(setRoleSchema)
	]);
	// After a role change the action redirects here with the address; echo it only if it is real.
	const changedEmail = url.searchParams.get('changed');
	const changed = users.find((user) => user.email === changedEmail) ?? null;
	return {
		adminId: admin.id,
		counts,
		users,
		health,
		roles: ROLES,
		roleForm,
		changed
	};
};

export const actions: Actions = {
	setRole: async ({ request }) => {
		const admin = requireRole('admin');
		const form = await readForm(request, setRoleSchema);
		if (!form) return unreadable(setRoleSchema);
		if (!form.valid) return refuse(form);
		const result = await setRole(admin, form.data);
		if (!result.ok) return say(form, result.message, result.reason === 'not-found' ? 404 : 422);
		redirect(303, `/admin?changed=${encodeURIComponent(result.user.email)}`);
	}
};
