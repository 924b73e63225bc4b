import { json } from '@sveltejs/kit';
import { readJsonBody } from '$lib/server/http/json';
import { withActor } from '$lib/server/library/api';
import { deleteDeck, getDeck, readDeckInput, updateDeck } from '$lib/server/library/decks';
import type { RequestHandler } from './$types';

/** `GET /api/decks/:id` → 200 the deck with its licks in order; 404 not the actor's to see. */
export const GET: RequestHandler = ({ locals, params }) =>
	withActor(locals, async (actor) => json(await getDeck(actor, params.id), { status: 200 }));

/**
 * `PUT /api/decks/:id` `{name?, description?, lickIds?}` → 200 the deck; `lickIds` replaces the
 * list and its order. Only the owner (403; 404 when not the actor's to see).
 */
export const PUT: RequestHandler = ({ locals, params, request }) =>
	withActor(locals, async (actor) => {
		const body = await readJsonBody(request, 64 * 1024);
		if (!body.ok) return body.response;
		return json(await updateDeck(actor, params.id, readDeckInput(body.value)), { status: 200 });
	});

/** `DELETE /api/decks/:id` → 204; the licks stay. 409 while a class has it assigned. */
export const DELETE: RequestHandler = ({ locals, params }) =>
	withActor(locals, async (actor) => {
		await deleteDeck(actor, params.id);
		return new Response(null, { status: 204 });
	});
