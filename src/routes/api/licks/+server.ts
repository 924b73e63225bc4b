import { json } from '@sveltejs/kit';
import { readJsonBody } from '$lib/server/http/json';
import { MAX_LICK_BODY_BYTES, readLickQuery, withActor } from '$lib/server/library/api';
import { createLick, listLicks, readLickInput } from '$lib/server/library/licks';
import type { RequestHandler } from './$types';

/**
 * `GET /api/licks?q=&quality=&key=&deck=&scope=&sort=&limit=&offset=` → 200 `{items, total}`:
 * the actor's licks (scope `mine`, the default), those their classes share (`shared`), public
 * ones (`public`) or all they may read (`all`). 400 for a bad query; 401 signed out.
 */
export const GET: RequestHandler = ({ locals, url }) =>
	withActor(locals, async (actor) =>
		json(await listLicks(actor, readLickQuery(url)), { status: 200 })
	);

/**
 * `POST /api/licks` `{title, abc, tags?, tempo?, feel?, visibility?, note?, versions?, homeKey?,
 * homeQuality?}` → 201 the lick. 422 invalid abc with `line`, `column` and the engine's message
 * (nothing stored); 400 wrong types; 413 too large; 415 not JSON; 401 signed out.
 */
export const POST: RequestHandler = ({ locals, request }) =>
	withActor(locals, async (actor) => {
		const body = await readJsonBody(request, MAX_LICK_BODY_BYTES);
		if (!body.ok) return body.response;
		const lick = await createLick(actor, readLickInput(body.value));
		return json(lick, { status: 201 });
	});
