import { redirect } from '@sveltejs/kit';
import { signInSchema } from '$lib/forms/account';
import { signIn } from '$lib/server/auth/password';
import { limitSignIn } from '$lib/server/auth/limits';
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
	default: async ({ request, cookies, getClientAddress, setHeaders, url }) => {
		const form = await readForm(request, signInSchema);
		if (!form) return unreadable(signInSchema);

		const tried = await limitSignIn(getClientAddress(), form.data.email, () => signIn(form.data));
		if (tried.limited) {
			// The same header as the API's 429, for clients and proxies that read it.
			setHeaders({ 'Retry-After': String(tried.retryAfterSeconds) });
			const minutes = Math.ceil(tried.retryAfterSeconds / 60);
			const text = `Too many tries. Take a breather and try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`;
			return say(form, text, 429, 'password');
		}
		const result = tried.result;
		if (!result.ok) return say(form, result.message, 400, 'password');
		await startSession(cookies, result.user.id);
		redirect(
			303,
			safeNext(form.data.next || url.searchParams.get('next'), homeFor(result.user.role))
		);
	}
};
