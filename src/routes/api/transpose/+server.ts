import { json } from '@sveltejs/kit';
import { apiError, readJsonBody, tooManyRequests } from '$lib/server/http/json';
import { renderLickVariant } from '$lib/server/music/render';
import {
	MAX_TRANSPOSE_BODY_BYTES,
	readTransposeInput,
	transposeLimiter
} from '$lib/server/music/transpose-request';
import type { RequestHandler } from './$types';

/**
 * `POST /api/transpose` `{ abc, to?, quality?, instrument?, tritone?, versions? }` → 200
 * `{ abc, key, writtenKey, quality, instrument, warnings, notes, devices, handWritten,
 * concertKey, writtenTonic, mode, meter, beatsPerBar, tempo }`; `versions` maps a quality to a
 * teacher's hand-written abc for it, which replaces re-mapping. Public (it serves the landing
 * page's try-it box) and limited per client address. 400 unreadable JSON or wrong types, 413
 * body over 20 KB or an answer over 1 MB, 415 not JSON, 422 malformed abc (with line and column)
 * or an unknown key, quality or instrument, 429 too many requests, 503 the engine's global budget
 * is spent for this second.
 */
export const POST: RequestHandler = async ({ request, getClientAddress }) => {
	const limit = await transposeLimiter().consume(getClientAddress());
	if (!limit.allowed) return tooManyRequests(limit.retryAfterSeconds, 'requests');
	const body = await readJsonBody(request, MAX_TRANSPOSE_BODY_BYTES);
	if (!body.ok) return body.response;
	const input = readTransposeInput(body.value);
	if (!input.ok) return apiError(input.status, input.message);

	const result = await renderLickVariant(
		{ abc: input.abc, versions: input.versions },
		input.options
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
