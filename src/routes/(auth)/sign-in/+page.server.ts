import { redirect } from '@sveltejs/kit';
import { signInSchema } from '$lib/forms/account';
import { signIn } from '$lib/server/auth/password';
import { beginSignIn, cancelSignIn, recordSignInSuccess } from '$lib/server/auth/limits';
import { homeFor, safeNext } from '$lib/server/auth/redirects';
import { startSession } from '$lib/server/auth/session';
import { filledForm, readForm, unreadable, say } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const next = url.searchParams.get('next');
	if (locals.user) redirect(303, safeNext(next, homeFor(locals.user.role)));
	return {
		form: await filledForm(signInSchema, { next: next ? safeNext(next, '') : '' }),
		reset: url.searchParams.has('reset')
	};
};

export const actions: Actions = {
	default: async ({ request, cookies, getClientAddress, url }) => {
		const form = await readForm(request, signInSchema);
		if (!form) return unreadable(signInSchema);

		const attempt = beginSignIn(getClientAddress(), form.data.email);
		if (!attempt.allowed) {
			const minutes = Math.ceil(attempt.retryAfterSeconds / 60);
			const text = `Too many tries. Take a breather and try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`;
			return say(form, text, 429, 'password');
		}

		const result = await signIn(form.data);
		if (!result.ok) {
			// A missing field is not a guess at a password: it does not count towards the limit.
			if (result.reason === 'invalid') cancelSignIn(attempt);
			return say(form, result.message, 400, 'password');
		}
		recordSignInSuccess(attempt);
		await startSession(cookies, result.user.id);
		redirect(
			303,
			safeNext(form.data.next || url.searchParams.get('next'), homeFor(result.user.role))
		);
	}
};
