import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/http/json';
import type { RequestHandler } from './$types';

/** `GET /api/me` → `{ id, name, email, role, emailVerified, settings }`; 401 without a session. */
export const GET: RequestHandler = ({ locals }) => {
	const user = locals.user;
	if (!user) return apiError(401, 'Sign in first.');
	const { id, name, email, role, emailVerified, settings } = user;
	return json({ id, name, email, role, emailVerified, settings }, { status: 200 });
};
