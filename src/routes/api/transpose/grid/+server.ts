import { json } from '@sveltejs/kit';
import { apiError, readJsonBody, tooManyRequests } from '$lib/server/http/json';
import { renderLickGrid } from '$lib/server/music/render';
import {
	MAX_TRANSPOSE_BODY_BYTES,
	readGridInput,
	transposeLimiter
} from '$lib/server/music/transpose-request';
import type { RequestHandler } from './$types';

/**
 * `POST /api/transpose/grid` `{ abc, keys?, qualities?, instrument?, tritone?, versions? }` → 200
 * `{ variants: [...], keys, qualities, instrument }`, each variant shaped as a `/api/transpose`
 * answer, keys outer. `keys` default to all twelve round the cycle of fourths, `qualities` to the
 * lick's own. Public and limited per client address like `/api/transpose`, counted once per grid.
 * 400 unreadable JSON or wrong types, 413 body over 20 KB or an answer over 1 MB, 415 not JSON,
 * 422 malformed abc (with line and column) or an unknown key, quality or instrument, 429 too
 * many requests from this address, 503 the engine's global budget is spent for this second.
 */
export const POST: RequestHandler = async ({ request, getClientAddress }) => {
	const limit = await transposeLimiter().consume(getClientAddress());
	if (!limit.allowed) return tooManyRequests(limit.retryAfterSeconds, 'requests');
	const body = await readJsonBody(request, MAX_TRANSPOSE_BODY_BYTES);
	if (!body.ok) return body.response;
	const input = readGridInput(body.value);
	if (!input.ok) return apiError(input.status, input.message);
	const result = await renderLickGrid(
		{ abc: input.abc, versions: input.versions },
		{
			keys: input.keys,
			qualities: input.qualities,
			instrument: input.instrument,
			tritone: input.tritone
		}
	);
	if (!result.ok) {
		const { status, message, ok: _, retryAfterSeconds, ...details } = result;
		return apiError(
			status,
			message,
			{ ...details, ...(retryAfterSeconds ? { retryAfterSeconds } : {}) },
			retryAfterSeconds ? { 'Retry-After': String(retryAfterSeconds) } : undefined
		);
	}
	return json(result.value, { status: 200 });
};
