import { fail, redirect } from '@sveltejs/kit';
import { resendVerification, verifyEmail } from '$lib/server/auth/accounts';
import { consumeResend } from '$lib/server/auth/limits';
import { homeFor, signInUrl } from '$lib/server/auth/redirects';
import type { Actions, PageServerLoad } from './$types';

/**
 * The target of the mailed link (`/verify-email?token=…`), and the "check your mail" screen
 * after sign-up (`?sent=1`). Opening the link is the confirmation: no extra click. Opened
 * without a link, the page says only what it knows: that a signed-in account is not confirmed
 * yet, or, to someone signed out, where the link is to be found.
 */
export const load: PageServerLoad = async ({ url, locals }) => {
	const token = url.searchParams.get('token');
	const user = locals.user;
	const base = {
		signedIn: user !== null,
		home: user ? homeFor(user.role) : '/sign-in',
		role: user?.role ?? null,
		email: user?.email ?? null
	};
	if (token !== null) {
		const result = await verifyEmail(token);
		if (result.ok) {
			return { ...base, screen: result.already ? 'already' : 'verified', message: null } as const;
		}
		return { ...base, screen: 'failed', message: result.message } as const;
	}
	if (!user) return { ...base, screen: 'signed-out', message: null } as const;
	if (user.emailVerified) return { ...base, screen: 'already', message: null } as const;
	const sent = url.searchParams.get('sent');
	const screen = sent === '1' ? 'waiting' : sent === '0' ? 'unsent' : 'unconfirmed';
	return { ...base, screen, message: null } as const;
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
		return { values: {}, resent: locals.user.email };
	}
};
