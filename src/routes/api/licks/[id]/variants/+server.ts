import { json } from '@sveltejs/kit';
import { libraryCheckLimiter, withActor } from '$lib/server/library/api';
import { lickVariants } from '$lib/server/library/licks';
import { tooManyRequests } from '$lib/server/http/json';
import type { RequestHandler } from './$types';

/**
 * `GET /api/licks/:id/variants?key=&quality=&instrument=` → 200 `{variants}`: the lick in that
 * key, or in all twelve (cycle of fourths) without one, over `quality` (its own by default) for
 * `instrument` (concert by default), hand-written versions in force. 422 unknown key, quality or
 * instrument; 404 not the actor's to see; 429 too many.
 */
export const GET: RequestHandler = ({ locals, params, url }) =>
	withActor(locals, async (actor) => {
		const limit = await libraryCheckLimiter().consume(actor.id);
		if (!limit.allowed) return tooManyRequests(limit.retryAfterSeconds, 'requests');
		const p = url.searchParams;
		const query = {
			key: p.get('key') || undefined,
			quality: p.get('quality') || undefined,
			instrument: p.get('instrument') || undefined
		};
		return json(await lickVariants(actor, params.id, query), { status: 200 });
	});
