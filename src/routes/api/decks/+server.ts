import { json } from '@sveltejs/kit';
import { readJsonBody } from '$lib/server/http/json';
import { readPaging, withActor } from '$lib/server/library/api';
import { createDeck, listDecks, readDeckInput } from '$lib/server/library/decks';
import type { RequestHandler } from './$types';

/** `GET /api/decks?q=&limit=&offset=` → 200 `{items, total}`: the actor's decks and their classes'. */
export const GET: RequestHandler = ({ locals, url }) =>
	withActor(locals, async (actor) =>
		json(await listDecks(actor, readPaging(url)), { status: 200 })
	);

/**
 * `POST /api/decks` `{name, description?, lickIds?}` → 201 the deck with its licks in the order
 * given. 422 for a lick the actor may not see, a repeated lick or a missing name.
 */
export const POST: RequestHandler = ({ locals, request }) =>
	withActor(locals, async (actor) => {
		const body = await readJsonBody(request);
		if (!body.ok) return body.response;
		return json(await createDeck(actor, readDeckInput(body.value)), { status: 201 });
	});
