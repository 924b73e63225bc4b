import { json } from '@sveltejs/kit';
import { computeVariant } from '$lib/music';
import { apiError, readJsonBody, tooManyRequests } from '$lib/server/http/json';
import {
	MAX_TRANSPOSE_BODY_BYTES,
	readTransposeInput,
	transposeLimiter
} from '$lib/server/music/transpose-request';
import type { RequestHandler } from './$types';

/**
 * `POST /api/transpose` `{ abc, to?, quality?, instrument?, tritone?, versions? }` → 200
 * `{ abc, key, writtenKey, quality, instrument, warnings, notes, devices, handWritten }`;
 * `versions` maps a quality to a teacher's hand-written abc for it, which replaces re-mapping.
 * Public (it serves the landing page's try-it box) and limited per client address. 400 unreadable JSON or wrong types,
 * 413 body over 20 KB, 415 not JSON, 422 malformed abc (with line and column) or an unknown key,
 * quality or instrument, 429 too many requests.
 */
export const POST: RequestHandler = async ({ request, getClientAddress }) => {
	const limit = transposeLimiter().consume(getClientAddress());
	if (!limit.allowed) return tooManyRequests(limit.retryAfterSeconds, 'requests');
	const body = await readJsonBody(request, MAX_TRANSPOSE_BODY_BYTES);
	if (!body.ok) return body.response;
	const input = readTransposeInput(body.value);
	if (!input.ok) return apiError(input.status, input.message);

	let result: ReturnType<typeof computeVariant>;
	try {
		result = computeVariant({ abc: input.abc, versions: input.versions, ...input.options });
	} catch (e) {
		// The engine answers bad abc with a result, not a throw; should one slip through, the
		// person still gets a sentence and a 422 rather than a server error.
		console.error('transpose: engine threw', e);
		return apiError(422, 'This lick could not be read; check the notation near its end.');
	}
	if (!result.ok) {
		const { message, ...position } = result.error;
		return apiError(422, message, position);
	}
	const { abc, key, writtenKey, quality, instrument, warnings, notes, devices, handWritten } =
		result;
	return json(
		{ abc, key, writtenKey, quality, instrument, warnings, notes, devices, handWritten },
		{ status: 200 }
	);
};
