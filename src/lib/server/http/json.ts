import { json } from '@sveltejs/kit';

/**
 * The edge of every JSON endpoint: reading a body safely and answering errors in one shape,
 * `{ "error": { "message": …, …details } }`, so that a client reads every refusal the same way.
 */

/** What an error may say besides its sentence: the field at fault, a position in abc, a wait. */
export interface ApiErrorDetails {
	field?: string;
	line?: number;
	column?: number;
	retryAfterSeconds?: number;
	/** The hand-written version (by quality) an abc error is in. */
	version?: string;
}

/**
 * A JSON error answer.
 * @example apiError(401, 'Sign in first.') // 401 { error: { message: 'Sign in first.' } }
 */
export function apiError(
	status: number,
	message: string,
	details: ApiErrorDetails = {},
	headers?: HeadersInit
): Response {
	return json({ error: { message, ...details } }, { status, headers });
}

/** A 429 answer with `Retry-After`, the same for every limited endpoint. */
export function tooManyRequests(retryAfterSeconds: number, what = 'attempts'): Response {
	return apiError(
		429,
		`Too many ${what}. Try again in ${retryAfterSeconds} seconds.`,
		{ retryAfterSeconds },
		{ 'Retry-After': String(retryAfterSeconds) }
	);
}

/** The largest JSON body the account endpoints read; anything longer is refused unread. */
export const MAX_JSON_BODY_BYTES = 16 * 1024;

export type JsonBody<T> = { ok: true; value: T } | { ok: false; response: Response };

/**
 * A request's body parsed as JSON, or a ready 400/413/415 answer that says what is wrong.
 * @example await readJsonBody(request, 20 * 1024) // { ok: true, value: { abc: '…' } }
 */
export async function readJsonBody(
	request: Request,
	maxBytes = MAX_JSON_BODY_BYTES
): Promise<JsonBody<unknown>> {
	const type = request.headers.get('content-type') ?? '';
	if (!/^application\/(?:[\w.+-]+\+)?json\b/i.test(type)) {
		return refuse(415, 'Send the body as JSON with Content-Type: application/json.');
	}
	const tooLarge = () =>
		refuse(413, `The body is larger than ${Math.round(maxBytes / 1024)} KB; send less.`);
	// A declared length over the limit is refused before anything is read.
	if (Number(request.headers.get('content-length') ?? 0) > maxBytes) return tooLarge();
	const read = await readTextUpTo(request, maxBytes);
	if (read === 'too-large') return tooLarge();
	if (read === 'unreadable') return refuse(400, 'The request body could not be read.');
	const text = read.text;
	try {
		return { ok: true, value: JSON.parse(text) as unknown };
	} catch {
		return refuse(400, 'The body is not valid JSON.');
	}
}

/**
 * Like `readJsonBody`, for endpoints that expect named fields: arrays, strings and `null` are
 * refused with 400.
 */
export async function readJsonObject(
	request: Request,
	maxBytes = MAX_JSON_BODY_BYTES
): Promise<JsonBody<Record<string, unknown>>> {
	const body = await readJsonBody(request, maxBytes);
	if (!body.ok) return body;
	const { value } = body;
	if (!value || typeof value !== 'object' || Array.isArray(value)) {
		return refuse(400, 'The body must be a JSON object with named fields.');
	}
	return { ok: true, value: value as Record<string, unknown> };
}

/**
 * A body's text, read chunk by chunk and abandoned as soon as it passes `maxBytes`: a chunked
 * body declares no length, so only counting what arrives can tell that it is too large (and
 * the server's own cap, which errors the stream, also means "too large", not "unreadable").
 * @example await readTextUpTo(request, 16 * 1024) // { text: '{"a":1}' } or 'too-large'
 */
export async function readTextUpTo(
	request: Request,
	maxBytes: number
): Promise<{ text: string } | 'too-large' | 'unreadable'> {
	if (!request.body) return { text: '' };
	if (request.bodyUsed) return 'unreadable';
	const reader = request.body.getReader();
	const chunks: Uint8Array[] = [];
	let size = 0;
	try {
		for (;;) {
			const { done, value } = await reader.read();
			if (done) break;
			size += value.byteLength;
			if (size > maxBytes) {
				void reader.cancel().catch(() => {});
				return 'too-large';
			}
			chunks.push(value);
		}
	} catch (caught) {
		return statusOf(caught) === 413 ? 'too-large' : 'unreadable';
	}
	const text = new TextDecoder('utf-8').decode(Buffer.concat(chunks));
	return { text };
}

function statusOf(caught: unknown): number | undefined {
	if (caught && typeof caught === 'object' && 'status' in caught) {
		const status = (caught as { status: unknown }).status;
		return typeof status === 'number' ? status : undefined;
	}
	return undefined;
}

function refuse(status: number, message: string): { ok: false; response: Response } {
	return { ok: false, response: apiError(status, message) };
}
