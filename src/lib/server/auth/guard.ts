import { error, redirect } from '@sveltejs/kit';
import { getRequestEvent } from '$app/server';
import type { Role } from '../db/models/index';
import { signInUrl } from './redirects';
import type { SessionUser } from './session';

/**
 * Guards for load functions and actions. The hook already gates whole route groups; these make
 * each page's own check explicit and hand back a typed user.
 */

/** The signed-in user, or a redirect to the sign-in page. */
export function requireUser(): SessionUser {
	const { locals, url } = getRequestEvent();
	if (!locals.user) redirect(303, signInUrl(url));
	return locals.user;
}

/** The signed-in user if they hold one of `roles`; otherwise sign-in (anonymous) or 403. */
export function requireRole(...roles: Role[]): SessionUser {
	const user = requireUser();
	if (!roles.includes(user.role)) {
		error(403, `This page is for ${roles.join(' or ')} accounts.`);
	}
	return user;
}
