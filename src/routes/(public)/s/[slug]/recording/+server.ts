import { apiError } from '$lib/server/http/json';
import { LibraryError } from '$lib/server/library/errors';
import { findSharedLick } from '$lib/server/library/licks';
import { recordingResponse } from '$lib/server/library/recordings';
import type { RequestHandler } from './$types';

/**
 * `GET /s/:slug/recording` → a public lick's reference recording for anyone holding its share
 * link, in byte ranges; 404 once the lick is no longer public.
 */
export const GET: RequestHandler = async ({ params, request }) => {
	const lick = await findSharedLick(params.slug);
	if (!lick) return apiError(404, 'No such shared lick.');
	try {
		return await recordingResponse(null, lick, request.headers.get('range'));
	} catch (e) {
		if (e instanceof LibraryError) return apiError(e.status, e.message);
		throw e;
	}
};
