import { json } from '@sveltejs/kit';
import { classLimits, refusal, signInFirst } from '$lib/server/classes/http';
import { joinByCode } from '$lib/server/classes/members';
import { readJsonObject, tooManyRequests } from '$lib/server/http/json';
import type { RequestHandler } from './$types';

/**
 * `POST /api/classes/join` `{code}` → 200 `{classId, className, teacherName, joined}` (`joined`
 * false when already a member); 404 unknown code, 409 archived class, 422 malformed code, 429.
 */
export const POST: RequestHandler = async ({ locals, request }) => {
	if (!locals.user) return signInFirst(null)!;
	const limit = await classLimits.join(locals.user.id);
	if (!limit.allowed) return tooManyRequests(limit.retryAfterSeconds, 'join attempts');
	const body = await readJsonObject(request);
	if (!body.ok) return body.response;
	const result = await joinByCode(locals.user, body.value.code);
	if (!result.ok) return refusal(result);
	const { classId, className, teacherName, joined } = result;
	return json({ classId, className, teacherName, joined });
};
