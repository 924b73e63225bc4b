import { fail, redirect } from '@sveltejs/kit';
import { resetPassword } from '$lib/server/auth/accounts';
import { readForm } from '$lib/server/auth/form';
import { deleteSessionCookie } from '$lib/server/auth/session';
import type { Actions, PageServerLoad } from './$types';

/** The target of the mailed reset link; the token travels on in a hidden field. */
export const load: PageServerLoad = ({ url }) => ({ token: url.searchParams.get('token') ?? '' });

export const actions: Actions = {
	default: async ({ request, cookies }) => {
		const form = await readForm(request);
		if (!form) return fail(400, { field: null, message: 'The form could not be read.' });
		if (form.password !== form.confirm) {
			return fail(422, { field: 'confirm', message: 'The two passwords are not the same.' });
		}
		const result = await resetPassword(form.token, form.password);
		if (!result.ok) {
			const field = result.reason === 'invalid' ? result.field : 'token';
			return fail(result.reason === 'invalid' ? 422 : 400, { field, message: result.message });
		}
		// Every session of the account has ended, this browser's too.
		deleteSessionCookie(cookies);
		redirect(303, '/sign-in?reset');
	}
};
