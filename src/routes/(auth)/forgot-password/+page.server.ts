import { redirect } from '@sveltejs/kit';
import { forgotPasswordSchema } from '$lib/forms/account';
import { queuePasswordReset } from '$lib/server/auth/reset';
import { consumeReset } from '$lib/server/auth/limits';
import { emptyForm, readForm, unreadable, refuse, say } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => ({
	form: await emptyForm(forgotPasswordSchema),
	sent: url.searchParams.has('sent')
});

export const actions: Actions = {
	default: async ({ request, getClientAddress, setHeaders }) => {
		const form = await readForm(request, forgotPasswordSchema);
		if (!form) return unreadable(forgotPasswordSchema);

		const limit = await consumeReset(getClientAddress(), form.data.email);
		if (!limit.allowed) {
			setHeaders({ 'Retry-After': String(limit.retryAfterSeconds) });
			const minutes = Math.ceil(limit.retryAfterSeconds / 60);
			return say(form, `Too many requests. Try again in ${minutes} minutes.`, 429);
		}
		if (!form.valid) return refuse(form);
		// The same answer, in the same time, whether or not the address has an account: the
		// look-up, the token and the mail happen after answering.
		queuePasswordReset(form.data.email);
		redirect(303, '/forgot-password?sent');
	}
};
