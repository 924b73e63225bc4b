import { json } from '@sveltejs/kit';
import { archiveClass, getClass, updateClass } from '$lib/server/classes/classes';
import { refusal, signInFirst } from '$lib/server/classes/http';
import { readJsonObject } from '$lib/server/http/json';
import type { RequestHandler } from './$types';

/**
 * `GET /api/classes/[id]` → `{class}` for its teacher or a member (404 for anyone else).
 * `PUT` `{name?, archived?, joinCode?: 'renew'|'off', joinLink?: 'renew'|'off'}` (its teacher).
 * `DELETE` archives it (its teacher): nothing is deleted, assignments pause, joining stops.
 */
export const GET: RequestHandler = async ({ locals, params }) => {
	if (!locals.user) return signInFirst(null)!;
	const result = await getClass(locals.user, params.id);
	return result.ok ? json(result.class) : refusal(result);
};

export const PUT: RequestHandler = async ({ locals, params, request }) => {
	if (!locals.user) return signInFirst(null)!;
	const body = await readJsonObject(request);
	if (!body.ok) return body.response;
	const result = await updateClass(locals.user, params.id, body.value);
	return result.ok ? json(result.class) : refusal(result);
};

export const DELETE: RequestHandler = async ({ locals, params }) => {
	if (!locals.user) return signInFirst(null)!;
	const result = await archiveClass(locals.user, params.id);
	return result.ok ? json(result.class) : refusal(result);
};
