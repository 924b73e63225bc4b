import { withActor } from '$lib/server/library/api';
import { exportDeck } from '$lib/server/library/export';
import type { RequestHandler } from './$types';

/** `GET /api/decks/:id/export` → 200 the deck's licks, in order, as one `.abc` file. */
export const GET: RequestHandler = ({ locals, params }) =>
	withActor(locals, async (actor) => {
		const file = await exportDeck(actor, params.id);
		return new Response(file.text, {
			status: 200,
			headers: {
				'content-type': 'text/vnd.abc; charset=utf-8',
				'content-disposition': `attachment; filename="${file.name}"`
			}
		});
	});
