import { fail, redirect } from '@sveltejs/kit';
import { checkHealth } from '$lib/server/admin/health';
import { countUsersByRole, listUsers } from '$lib/server/admin/users';
import { normalizeEmail, promote } from '$lib/server/auth/accounts';
import { readForm } from '$lib/server/auth/form';
import { requireRole } from '$lib/server/auth/guard';
import { ROLES } from '$lib/server/db/models/index';
import type { Actions, PageServerLoad } from './$types';

const USERS_SHOWN = 100;

export const load: PageServerLoad = async ({ url }) => {
	const admin = requireRole('admin');
	const [counts, users, health] = await Promise.all([
		countUsersByRole(),
		listUsers({ limit: USERS_SHOWN }),
		checkHealth()
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
		changed
	};
};

export const actions: Actions = {
	setRole: async ({ request }) => {
		const admin = requireRole('admin');
		const form = await readForm(request);
		if (!form) {
			return fail(400, {
				email: '',
				role: '',
				message: 'The form could not be read; send it again.'
			});
		}
		const { email = '', role = '' } = form;
		const typed = { email, role };
		// Demoting yourself could leave the site without any admin; another admin must do it.
		if (normalizeEmail(email) === admin.email) {
			return fail(422, {
				...typed,
				message: 'You cannot change your own role; ask another admin.'
			});
		}
		const result = await promote(email, role);
		if (!result.ok) {
			return fail(result.reason === 'not-found' ? 404 : 422, { ...typed, message: result.message });
		}
		redirect(303, `/admin?changed=${encodeURIComponent(result.user.email)}`);
	}
};
