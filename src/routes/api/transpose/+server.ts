import { json } from '@sveltejs/kit';
import { computeVariant } from '$lib/music';
import {
	MAX_TRANSPOSE_BODY_BYTES,
	readTransposeInput,
	transposeLimiter
} from '$lib/server/music/transpose-request';
import type { RequestHandler } from './$types';

const fail = (
	status: number,
	error: { message: string; line?: number; column?: number },
	headers?: HeadersInit
) => json({ error }, { status, headers });

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
	if (!limit.allowed) {
		return fail(
			429,
			{ message: `Too many requests. Try again in ${limit.retryAfterSeconds} seconds.` },
			{ 'Retry-After': String(limit.retryAfterSeconds) }
		);
	}
	const declared = Number(request.headers.get('content-length') ?? 0);
	if (declared > MAX_TRANSPOSE_BODY_BYTES) return tooLarge();
	if (!/^application\/(?:[\w.+-]+\+)?json\b/i.test(request.headers.get('content-type') ?? '')) {
		return fail(415, { message: 'Send the body as JSON with Content-Type: application/json.' });
	}
	let text: string;
	try {
		text = await request.text();
	} catch {
		return fail(400, { message: 'The request body could not be read.' });
	}
	if (Buffer.byteLength(text, 'utf8') > MAX_TRANSPOSE_BODY_BYTES) return tooLarge();
	let body: unknown;
	try {
		body = JSON.parse(text);
	} catch {
		return fail(400, { message: 'The body is not valid JSON.' });
	}
	const input = readTransposeInput(body);
	if (!input.ok) return fail(input.status, { message: input.message });

	let result: ReturnType<typeof computeVariant>;
	try {
		result = computeVariant({ abc: input.abc, versions: input.versions, ...input.options });
	} catch (e) {
		// The engine answers bad abc with a result, not a throw; should one slip through, the
		// person still gets a sentence and a 422 rather than a server error.
		console.error('transpose: engine threw', e);
		return fail(422, { message: 'This lick could not be read; check the notation near its end.' });
	}
	if (!result.ok) return fail(422, result.error);
	const { abc, key, writtenKey, quality, instrument, warnings, notes, devices, handWritten } =
		result;
	return json(
		{ abc, key, writtenKey, quality, instrument, warnings, notes, devices, handWritten },
		{ status: 200 }
	);
};

function tooLarge(): Response {
	return fail(413, { message: 'The request is larger than 20 KB; a lick must be shorter.' });
}
