import { redirect } from '@sveltejs/kit';
import { signUpSchema } from '$lib/forms/account';
import { signUp } from '$lib/server/auth/accounts';
import { consumeSignUp } from '$lib/server/auth/limits';
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
		invitedTo: preview?.status === 'open' ? preview.className : null
	};
};

export const actions: Actions = {
	default: async ({ request, cookies, getClientAddress, url }) => {
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
