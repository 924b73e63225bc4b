import { redirect } from '@sveltejs/kit';
import { deleteSessionCookie, invalidateSession } from '$lib/server/auth/session';
import type { RequestHandler } from './$types';

/**
 * `POST /sign-out` from the header's form: end the session, then back to the landing page.
 * POST only, so that a link or a prefetch cannot sign anyone out; SvelteKit's origin check
 * covers it like any form.
 */
export const POST: RequestHandler = async ({ locals, cookies }) => {
	if (locals.session) await invalidateSession(locals.session.id);
	deleteSessionCookie(cookies);
	redirect(303, '/');
};
