import { fail, redirect } from '@sveltejs/kit';
import { requestPasswordReset } from '$lib/server/auth/accounts';
import { readForm } from '$lib/server/auth/form';
import { consumeReset } from '$lib/server/auth/limits';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ url }) => ({ sent: url.searchParams.has('sent') });

export const actions: Actions = {
	default: async ({ request, getClientAddress }) => {
		const form = await readForm(request);
		if (!form) return fail(400, { values: { email: '' }, message: 'The form could not be read.' });
		const values = { email: form.email ?? '' };

		const limit = consumeReset(getClientAddress(), values.email);
		if (!limit.allowed) {
			return fail(429, {
				values,
				message: `Too many requests. Try again in ${Math.ceil(limit.retryAfterSeconds / 60)} minutes.`
			});
		}
		const result = await requestPasswordReset(values.email);
		if (!result.ok) return fail(422, { values, message: result.message });
		// The same answer whether or not the address has an account.
		redirect(303, '/forgot-password?sent');
	}
};
