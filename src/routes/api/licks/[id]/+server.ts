import { json } from '@sveltejs/kit';
import { readJsonBody } from '$lib/server/http/json';
import { MAX_LICK_BODY_BYTES, withActor } from '$lib/server/library/api';
import { deleteLick, getLick, readLickInput, updateLick } from '$lib/server/library/licks';
import type { RequestHandler } from './$types';

/** `GET /api/licks/:id` → 200 the lick; 404 when it is not there or not the actor's to see. */
export const GET: RequestHandler = ({ locals, params }) =>
	withActor(locals, async (actor) => json(await getLick(actor, params.id), { status: 200 }));

/**
 * `PUT /api/licks/:id` with any of the lick's fields → 200 the lick. Only the author: 403 for a
 * lick the actor may see but did not write, 404 for one they may not see. 422 invalid abc.
 */
export const PUT: RequestHandler = ({ locals, params, request }) =>
	withActor(locals, async (actor) => {
		const body = await readJsonBody(request, MAX_LICK_BODY_BYTES);
		if (!body.ok) return body.response;
		return json(await updateLick(actor, params.id, readLickInput(body.value)), { status: 200 });
	});

/** `DELETE /api/licks/:id` → 204; the lick's versions, tags, deck places and recording go too. */
export const DELETE: RequestHandler = ({ locals, params }) =>
	withActor(locals, async (actor) => {
		await deleteLick(actor, params.id);
		return new Response(null, { status: 204 });
	});
