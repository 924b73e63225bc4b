import { json } from '@sveltejs/kit';

/** The largest JSON body the account endpoints read; anything longer is refused unread. */
const MAX_BODY_BYTES = 16 * 1024;

export type JsonBody =
	{ ok: true; value: Record<string, unknown> } | { ok: false; response: Response };

/**
 * A request's body as a JSON object, or a ready 400/413/415 answer that says what is wrong.
 * Arrays, strings and `null` are refused: every endpoint here expects named fields.
 */
export async function readJsonObject(request: Request): Promise<JsonBody> {
	const type = request.headers.get('content-type') ?? '';
	if (!/^application\/(?:[\w.+-]+\+)?json\b/i.test(type)) {
		return refuse(415, 'Send the body as JSON with Content-Type: application/json.');
	}
	let text: string;
	try {
		text = await request.text();
	} catch {
		return refuse(400, 'The request body could not be read.');
	}
	if (Buffer.byteLength(text, 'utf8') > MAX_BODY_BYTES) {
		return refuse(413, `The body is larger than ${MAX_BODY_BYTES} bytes.`);
	}
	let value: unknown;
	try {
		value = JSON.parse(text);
	} catch {
		return refuse(400, 'The body is not valid JSON.');
	}
	if (!value || typeof value !== 'object' || Array.isArray(value)) {
		return refuse(400, 'The body must be a JSON object with named fields.');
	}
	return { ok: true, value: value as Record<string, unknown> };
}

function refuse(status: number, message: string): JsonBody {
	return { ok: false, response: json({ message }, { status }) };
}

/** A 429 answer with `Retry-After`, the same for every limited endpoint. */
export function tooManyRequests(retryAfterSeconds: number): Response {
	return json(
		{ message: `Too many attempts. Try again in ${retryAfterSeconds} seconds.`, retryAfterSeconds },
		{ status: 429, headers: { 'Retry-After': String(retryAfterSeconds) } }
	);
}
