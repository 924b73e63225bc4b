import { json } from '@sveltejs/kit';
import { listComments, postComment } from '$lib/server/classes/comments';
import { refusal, signInFirst } from '$lib/server/classes/http';
import { readJsonObject } from '$lib/server/http/json';
import type { RequestHandler } from './$types';

/**
 * `GET /api/cards/[id]/comments` → `{items, total}` (the card's learner, or the teacher of the
 * class it was assigned in); reading marks the other party's comments seen.
 */
export const GET: RequestHandler = async ({ locals, params }) => {
	if (!locals.user) return signInFirst(null)!;
	const result = await listComments(locals.user, params.id);
	return result.ok ? json({ items: result.items, total: result.total }) : refusal(result);
};

/** `POST /api/cards/[id]/comments` `{text}` → 201 `{comment}`. */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	if (!locals.user) return signInFirst(null)!;
	const body = await readJsonObject(request);
	if (!body.ok) return body.response;
	const result = await postComment(locals.user, params.id, body.value);
	return result.ok ? json({ comment: result.comment }, { status: 201 }) : refusal(result);
};
