import { deleteSessionCookie, invalidateSession } from '$lib/server/auth/session';
import type { RequestHandler } from './$types';

/** `POST /api/auth/sign-out` → 204; ends the current session (none is fine: still 204). */
export const POST: RequestHandler = async ({ locals, cookies }) => {
	if (locals.session) await invalidateSession(locals.session.id);
	deleteSessionCookie(cookies);
	locals.user = null;
	locals.session = null;
	return new Response(null, { status: 204 });
};
