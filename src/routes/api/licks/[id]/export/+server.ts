import { withActor } from '$lib/server/library/api';
import { exportLick } from '$lib/server/library/export';
import type { RequestHandler } from './$types';

/** `GET /api/licks/:id/export` → 200 an `.abc` file that imports back to the same lick. */
export const GET: RequestHandler = ({ locals, params }) =>
	withActor(locals, async (actor) => {
		const file = await exportLick(actor, params.id);
		return abcFile(file);
	});

function abcFile(file: { name: string; text: string }): Response {
	return new Response(file.text, {
		status: 200,
		headers: {
			'content-type': 'text/vnd.abc; charset=utf-8',
			'content-disposition': `attachment; filename="${file.name}"`
		}
	});
}
