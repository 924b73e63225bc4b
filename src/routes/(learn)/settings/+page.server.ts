import { fail, redirect } from '@sveltejs/kit';
import { changePassword, deleteAccount } from '$lib/server/auth/accounts';
import { updateSettings } from '$lib/server/study/settings';
import { readForm } from '$lib/server/auth/form';
import { requireUser } from '$lib/server/auth/guard';
import { deleteSessionCookie } from '$lib/server/auth/session';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ url }) => {
	const user = requireUser();
	return {
		account: {
			name: user.name,
			email: user.email,
			role: user.role,
			emailVerified: user.emailVerified
		},
		practice: user.settings,
		changed: url.searchParams.get('changed')
	};
};

export const actions: Actions = {
	practice: async ({ request }) => {
		const user = requireUser();
		const form = await readForm(request);
		if (!form) {
			return fail(400, { form: 'practice', field: null, message: 'The form could not be read.' });
		}
		const result = await updateSettings(user.id, form);
		if (!result.ok) {
			// The typed values come back so that the form shows what was sent, not what is stored.
			return fail(result.reason === 'invalid' ? 422 : 400, {
				form: 'practice',
				field: result.reason === 'invalid' ? result.field : null,
				message: result.message,
				values: {
					instrument: form.instrument ?? '',
					dailyMinutes: form.dailyMinutes ?? '',
					keyOrder: form.keyOrder ?? '',
					desiredRetention: form.desiredRetention ?? '',
					timezone: form.timezone ?? '',
					digestHour: form.digestHour ?? '',
					digestEnabled: form.digestEnabled === 'on',
					dayStartHour: form.dayStartHour ?? '',
					newPerDay: form.newPerDay ?? ''
				}
			});
		}
		redirect(303, '/settings?changed=practice');
	},

	password: async ({ request, locals }) => {
		const user = requireUser();
		const form = await readForm(request);
		if (!form) {
			return fail(400, { form: 'password', field: null, message: 'The form could not be read.' });
		}
		if (form.password !== form.confirm) {
			return fail(422, {
				form: 'password',
				field: 'confirm',
				message: 'The two new passwords are not the same.'
			});
		}
		const result = await changePassword(
			user.id,
			form.currentPassword,
			form.password,
			locals.session?.id
		);
		if (!result.ok) {
			return fail(result.reason === 'invalid' ? 422 : 400, {
				form: 'password',
				field: result.reason === 'invalid' ? result.field : null,
				message: result.message
			});
		}
		redirect(303, '/settings?changed=password');
	},

	delete: async ({ request, cookies }) => {
		const user = requireUser();
		const form = await readForm(request);
		if (!form) {
			return fail(400, { form: 'delete', field: null, message: 'The form could not be read.' });
		}
		if ((form.confirmEmail ?? '').trim().toLowerCase() !== user.email) {
			return fail(422, {
				form: 'delete',
				field: 'confirmEmail',
				message: 'Type your e-mail address exactly to confirm; nothing was deleted.'
			});
		}
		const result = await deleteAccount(user.id, form.deletePassword);
		if (!result.ok) {
			return fail(result.reason === 'invalid' ? 422 : 400, {
				form: 'delete',
				field: result.reason === 'invalid' ? 'deletePassword' : null,
				message: result.message
			});
		}
		deleteSessionCookie(cookies);
		redirect(303, '/?farewell');
	}
};
