import { json } from '@sveltejs/kit';
import { classLimits, refusal, signInFirst } from '$lib/server/classes/http';
import { inviteByEmail, listInvitations } from '$lib/server/classes/invitations';
import { readJsonObject, tooManyRequests } from '$lib/server/http/json';
import type { RequestHandler } from './$types';

/** `GET /api/classes/[id]/invitations` → `{items, total}` (its teacher). */
export const GET: RequestHandler = async ({ locals, params }) => {
	if (!locals.user) return signInFirst(null)!;
	const result = await listInvitations(locals.user, params.id);
	return result.ok ? json({ items: result.items, total: result.total }) : refusal(result);
};

/**
 * `POST /api/classes/[id]/invitations` `{email}` (its teacher) → 201 `{invitation, mailSent}`
 * and the invitation mail; 422 bad address, 409 archived class, 429 over 30 an hour.
 */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	if (!locals.user) return signInFirst(null)!;
	const body = await readJsonObject(request);
	if (!body.ok) return body.response;
	const limit = await classLimits.invite(locals.user.id);
	if (!limit.allowed) return tooManyRequests(limit.retryAfterSeconds, 'invitations');
	const result = await inviteByEmail(locals.user, params.id, body.value);
	if (!result.ok) return refusal(result);
	return json({ invitation: result.invitation, mailSent: result.mailSent }, { status: 201 });
};
