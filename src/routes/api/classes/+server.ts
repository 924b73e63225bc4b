import { json } from '@sveltejs/kit';
import { createClass, listClasses } from '$lib/server/classes/classes';
import { refusal, signInFirst } from '$lib/server/classes/http';
import { readJsonObject } from '$lib/server/http/json';
import type { RequestHandler } from './$types';

/**
 * `GET /api/classes` (`?archived=1` includes archived ones) → `{items, total}`: the classes the
 * user teaches, then those they belong to. `POST /api/classes` `{name}` (teachers) → 201 `{class}`.
 */
export const GET: RequestHandler = async ({ locals, url }) => {
	if (!locals.user) return signInFirst(null)!;
	return json(
		await listClasses(locals.user, { archived: url.searchParams.get('archived') === '1' })
	);
};

export const POST: RequestHandler = async ({ locals, request }) => {
	if (!locals.user) return signInFirst(null)!;
	const body = await readJsonObject(request);
	if (!body.ok) return body.response;
	const result = await createClass(locals.user, body.value);
	if (!result.ok) return refusal(result);
	return json(result.class, { status: 201 });
};
