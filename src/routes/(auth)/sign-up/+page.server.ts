import { fail, redirect } from '@sveltejs/kit';
import { signUp } from '$lib/server/auth/accounts';
import { readForm } from '$lib/server/auth/form';
import { consumeSignUp } from '$lib/server/auth/limits';
import { homeFor, safeNext } from '$lib/server/auth/redirects';
import { acceptInvitation, previewInvitation } from '$lib/server/classes/invitations';
import { startSession } from '$lib/server/auth/session';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	if (locals.user) redirect(303, homeFor(locals.user.role));
	// Arriving from a class invitation: the token rides along in the form, and the page says where
	// the new account will land.
	const invitation = url.searchParams.get('invitation');
	const preview = invitation ? await previewInvitation(invitation) : null;
	return {
		invitation: preview?.status === 'open' ? invitation : null,
		invitedTo: preview?.status === 'open' ? preview.className : null,
		next: url.searchParams.get('next')
	};
};

export const actions: Actions = {
	default: async ({ request, cookies, getClientAddress }) => {
		const form = await readForm(request);
		const empty = { name: '', email: '', role: 'learner' };
		if (!form)
			return fail(400, { values: empty, field: null, message: 'The form could not be read.' });
		const values = {
			name: form.name ?? '',
			email: form.email ?? '',
			role: form.role ?? 'learner'
		};

		const limit = consumeSignUp(getClientAddress(), values.email);
		if (!limit.allowed) {
			return fail(429, {
				values,
				field: null,
				message: `Too many sign-ups from here. Try again in ${Math.ceil(limit.retryAfterSeconds / 60)} minutes.`
			});
		}

		const result = await signUp({ ...values, password: form.password });
		if (!result.ok) {
			return fail(result.reason === 'email-taken' ? 409 : 422, {
				values,
				field: result.field,
				message: result.message
			});
		}
		// Signed in straight away; the confirmation link can be followed whenever the mail arrives.
		await startSession(cookies, result.user.id);
		if (form.invitation) {
			const joined = await acceptInvitation(result.user, form.invitation);
			if (joined.ok) redirect(303, `/classes?joined=${encodeURIComponent(joined.className)}`);
		}
		if (form.next) redirect(303, safeNext(form.next));
		redirect(303, `/verify-email?sent=${result.mailSent ? '1' : '0'}`);
	}
};
