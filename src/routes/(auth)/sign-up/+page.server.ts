import { redirect } from '@sveltejs/kit';
import { signUpSchema } from '$lib/forms/account';
import { signUp } from '$lib/server/auth/accounts';
import { consumeSignUp } from '$lib/server/auth/limits';
import { homeFor } from '$lib/server/auth/redirects';
import { startSession } from '$lib/server/auth/session';
import { emptyForm, readForm, unreadable, refuse, refuseField, say } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	if (locals.user) redirect(303, homeFor(locals.user.role));
	return { form: await emptyForm(signUpSchema) };
};

export const actions: Actions = {
	default: async ({ request, cookies, getClientAddress }) => {
		const form = await readForm(request, signUpSchema);
		if (!form) return unreadable(signUpSchema);

		const limit = consumeSignUp(getClientAddress(), form.data.email);
		if (!limit.allowed) {
			const minutes = Math.ceil(limit.retryAfterSeconds / 60);
			return say(
				form,
				`Too many sign-ups from here. Try again in ${minutes} minutes.`,
				429,
				'password'
			);
		}
		if (!form.valid) return refuse(form, 'password');

		const result = await signUp(form.data);
		if (!result.ok) {
			const status = result.reason === 'email-taken' ? 409 : 422;
			return refuseField(form, result.field, result.message, status, 'password');
		}
		// Signed in straight away; the confirmation link can be followed whenever the mail arrives.
		await startSession(cookies, result.user.id);
		redirect(303, `/verify-email?sent=${result.mailSent ? '1' : '0'}`);
	}
};
