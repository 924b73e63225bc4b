import { redirect } from '@sveltejs/kit';
import { resetPasswordSchema } from '$lib/forms/account';
import { checkToken } from '$lib/server/auth/email-token';
import { resetPassword } from '$lib/server/auth/reset';
import { deleteSessionCookie } from '$lib/server/auth/session';
import { filledForm, readForm, unreadable, refuse, refuseField, say } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

/**
 * The target of the mailed reset link; the token travels on in a hidden field. A link that is
 * missing, spent, replaced or expired is said at once, with no form to fill in for nothing.
 */
export const load: PageServerLoad = async ({ url }) => {
	const token = url.searchParams.get('token') ?? '';
	const live = token ? await checkToken(token, 'reset', new Date()) : null;
	return {
		form: await filledForm(resetPasswordSchema, { token }),
		linkProblem: live && !live.ok ? live.message : null
	};
};

export const actions: Actions = {
	default: async ({ request, cookies }) => {
		const form = await readForm(request, resetPasswordSchema);
		if (!form) return unreadable(resetPasswordSchema);
		if (!form.valid) return refuse(form, 'password', 'confirm');
		const result = await resetPassword(form.data.token, form.data.password);
		if (!result.ok) {
			if (result.reason === 'invalid') {
				return refuseField(form, result.field, result.message, 422, 'password', 'confirm');
			}
			// The link itself is spent or wrong: said about the form, with a way to a new one.
			return say(form, result.message, 400, 'password', 'confirm');
		}
		// Every session of the account has ended, this browser's too.
		deleteSessionCookie(cookies);
		redirect(303, '/sign-in?reset');
	}
};
