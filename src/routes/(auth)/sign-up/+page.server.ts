import { redirect } from '@sveltejs/kit';
import { signUpSchema } from '$lib/forms/account';
import { signUp } from '$lib/server/auth/accounts';
import { consumeReset, consumeSignUp } from '$lib/server/auth/limits';
import { queuePasswordReset } from '$lib/server/auth/reset';
import { homeFor, safeNext } from '$lib/server/auth/redirects';
import { acceptInvitation, previewInvitation } from '$lib/server/classes/invitations';
import { startSession } from '$lib/server/auth/session';
import { emptyForm, readForm, unreadable, refuse, refuseField, say } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	if (locals.user) redirect(303, homeFor(locals.user.role));
	// Arriving from a class invitation: the page says where the new account will land. The token
	// stays in the address, which the form posts back to, so the action reads it from there.
	const invitation = url.searchParams.get('invitation');
	const preview = invitation ? await previewInvitation(invitation) : null;
	return {
		form: await emptyForm(signUpSchema),
		sent: url.searchParams.has('sent'),
		invitedTo: preview?.status === 'open' ? preview.className : null
	};
};

export const actions: Actions = {
	default: async ({ request, cookies, getClientAddress, setHeaders, url }) => {
		const form = await readForm(request, signUpSchema);
		if (!form) return unreadable(signUpSchema);

		const limit = await consumeSignUp(getClientAddress(), form.data.email);
		if (!limit.allowed) {
			setHeaders({ 'Retry-After': String(limit.retryAfterSeconds) });
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
		if (!result.ok && result.reason === 'email-taken') {
			// The page says (and does) what the reset page does, so it does not tell a stranger
			// that this address has an account: its owner gets a reset link, within the reset
			// limits. (The API still answers 409: a client there needs the reason.)
			const reset = await consumeReset(getClientAddress(), form.data.email);
			if (reset.allowed) queuePasswordReset(form.data.email);
			redirect(303, '/sign-up?sent');
		}
		if (!result.ok) return refuseField(form, result.field, result.message, 422, 'password');
		// Signed in straight away; the confirmation link can be followed whenever the mail arrives.
		await startSession(cookies, result.user.id);
		const invitation = url.searchParams.get('invitation');
		if (invitation) {
			const joined = await acceptInvitation(result.user, invitation);
			if (joined.ok) redirect(303, `/classes?joined=${encodeURIComponent(joined.className)}`);
		}
		const next = url.searchParams.get('next');
		if (next) redirect(303, safeNext(next));
		redirect(303, `/verify-email?sent=${result.mailSent ? '1' : '0'}`);
	}
};
