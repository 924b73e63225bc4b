import { json } from '@sveltejs/kit';
import { deleteAssignment, updateAssignment } from '$lib/server/classes/assignments';
import { refusal, signInFirst } from '$lib/server/classes/http';
import { readJsonObject } from '$lib/server/http/json';
import type { RequestHandler } from './$types';

/** `PUT /api/assignments/[id]` any creation field but the deck, and `paused` → `{assignment}`. */
export const PUT: RequestHandler = async ({ locals, params, request }) => {
	if (!locals.user) return signInFirst(null)!;
	const body = await readJsonObject(request);
	if (!body.ok) return body.response;
	const result = await updateAssignment(locals.user, params.id, body.value);
	return result.ok ? json({ assignment: result.assignment }) : refusal(result);
};

/** `DELETE /api/assignments/[id]` → `{retired}`: its new cards retire, practised ones stay. */
export const DELETE: RequestHandler = async ({ locals, params }) => {
	if (!locals.user) return signInFirst(null)!;
	const result = await deleteAssignment(locals.user, params.id);
	return result.ok ? json({ retired: result.retired }) : refusal(result);
};
