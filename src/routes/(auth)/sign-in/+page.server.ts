import { fail, redirect } from '@sveltejs/kit';
import { signIn } from '$lib/server/auth/accounts';
import { readForm } from '$lib/server/auth/form';
import { beginSignIn, cancelSignIn, recordSignInSuccess } from '$lib/server/auth/limits';
import { homeFor, safeNext } from '$lib/server/auth/redirects';
import { startSession } from '$lib/server/auth/session';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, url }) => {
	const next = url.searchParams.get('next');
	if (locals.user) redirect(303, safeNext(next, homeFor(locals.user.role)));
	return { next: next ? safeNext(next, '') : '', reset: url.searchParams.has('reset') };
};

export const actions: Actions = {
	default: async ({ request, cookies, getClientAddress, url }) => {
		const form = await readForm(request);
		if (!form) return fail(400, { values: { email: '' }, message: 'The form could not be read.' });
		const values = { email: form.email ?? '' };

		const attempt = beginSignIn(getClientAddress(), values.email);
		if (!attempt.allowed) {
			const minutes = Math.ceil(attempt.retryAfterSeconds / 60);
			return fail(429, {
				values,
				message: `Too many tries. Take a breather and try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`
			});
		}

		const result = await signIn({ email: form.email, password: form.password });
		if (!result.ok) {
			if (result.reason === 'invalid') cancelSignIn(attempt);
			return fail(400, { values, message: result.message });
		}
		recordSignInSuccess(attempt);
		await startSession(cookies, result.user.id);
		redirect(303, safeNext(form.next ?? url.searchParams.get('next'), homeFor(result.user.role)));
	}
};
