import { json } from '@sveltejs/kit';
import { createAssignment, listAssignments } from '$lib/server/classes/assignments';
import { refusal, signInFirst } from '$lib/server/classes/http';
import { readJsonObject } from '$lib/server/http/json';
import type { RequestHandler } from './$types';

/** `GET /api/classes/[id]/assignments` → `{items, total}` (its teacher and its members). */
export const GET: RequestHandler = async ({ locals, params }) => {
	if (!locals.user) return signInFirst(null)!;
	const result = await listAssignments(locals.user, params.id);
	return result.ok ? json({ items: result.items, total: result.total }) : refusal(result);
};

/**
 * `POST /api/classes/[id]/assignments` `{deckId, startDate, newPerDay, keys?, qualities?,
 * targetTempo?, endDate?}` (its teacher, one of their decks) → 201 `{assignment}`; every member's
 * cards are made at once.
 */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	if (!locals.user) return signInFirst(null)!;
	const body = await readJsonObject(request);
	if (!body.ok) return body.response;
	const result = await createAssignment(locals.user, params.id, body.value);
	if (!result.ok) return refusal(result);
	return json({ assignment: result.assignment }, { status: 201 });
};
