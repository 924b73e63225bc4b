import { fail, redirect } from '@sveltejs/kit';
import { resendVerification, verifyEmail } from '$lib/server/auth/accounts';
import { consumeResend } from '$lib/server/auth/limits';
import { signInUrl } from '$lib/server/auth/redirects';
import type { Actions, PageServerLoad } from './$types';

/**
 * The target of the mailed link (`/verify-email?token=…`), and the "check your mail" screen
 * after sign-up (`?sent=1`). Opening the link is the confirmation: no extra click.
 */
export const load: PageServerLoad = async ({ url, locals }) => {
	const token = url.searchParams.get('token');
	const signedIn = locals.user !== null;
	if (token !== null) {
		const result = await verifyEmail(token);
		if (result.ok) {
			return { screen: result.already ? 'already' : 'verified', message: null, signedIn } as const;
		}
		return { screen: 'failed', message: result.message, signedIn } as const;
	}
	if (locals.user?.emailVerified) return { screen: 'already', message: null, signedIn } as const;
	const sent = url.searchParams.get('sent');
	return { screen: sent === '0' ? 'unsent' : 'waiting', message: null, signedIn } as const;
};

export const actions: Actions = {
	/** Send the link again (signed in, not yet confirmed). */
	resend: async ({ locals, url, setHeaders }) => {
		if (!locals.user) redirect(303, signInUrl(url));
		const limit = await consumeResend(locals.user.id);
		if (!limit.allowed) {
			setHeaders({ 'Retry-After': String(limit.retryAfterSeconds) });
			return fail(429, {
				values: {},
				message: `Three links an hour is the most we send. Try again in ${Math.ceil(limit.retryAfterSeconds / 60)} minutes.`
			});
		}
		const result = await resendVerification(locals.user.id);
		if (!result.ok) {
			if (result.reason === 'already-verified') redirect(303, '/verify-email');
			return fail(400, { values: {}, message: 'This account no longer exists.' });
		}
		if (!result.mailSent) {
			return fail(503, {
				values: {},
				message: 'The mail could not be sent just now. Try again in a few minutes.'
			});
		}
		redirect(303, '/verify-email?sent=1');
	}
};
