import { redirect } from '@sveltejs/kit';
import { deleteSessionCookie, invalidateSession } from '$lib/server/auth/session';
import type { Actions, PageServerLoad } from './$types';

/**
 * `GET /sign-out` (a typed address, an old bookmark) asks before signing out, because a link or a
 * prefetch must never sign anyone out; someone not signed in goes to the front page.
 */
export const load: PageServerLoad = ({ locals }) => {
	if (!locals.user) redirect(303, '/');
	return { name: locals.user.name };
};

export const actions: Actions = {
	/** `POST /sign-out` from the header's form or this page: end the session, then the front page. */
	default: async ({ locals, cookies }) => {
		if (locals.session) await invalidateSession(locals.session.id);
		deleteSessionCookie(cookies);
		redirect(303, '/');
	}
};
