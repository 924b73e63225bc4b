/**
 * Reading an uploaded file from a request without holding more than a limit in memory: the raw
 * body, or the named field of a `multipart/form-data` body.
 */
export type Upload =
	| { ok: true; bytes: Uint8Array; name: string | null }
	| { ok: false; status: 400 | 413; message: string };

/** The body's bytes, stopping as soon as they pass `maxBytes` (413 then). */
async function readCapped(
	request: Request,
	maxBytes: number
): Promise<Uint8Array<ArrayBuffer> | null> {
	if (!request.body) return new Uint8Array(new ArrayBuffer(0));
	const reader = request.body.getReader();
	const chunks: Uint8Array[] = [];
	let total = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		total += value.byteLength;
		if (total > maxBytes) {
			await reader.cancel();
			return null;
		}
		chunks.push(value);
	}
	const out = new Uint8Array(new ArrayBuffer(total));
	let at = 0;
	for (const c of chunks) {
		out.set(c, at);
		at += c.byteLength;
	}
	return out;
}

/**
 * The uploaded file: field `field` of a multipart body, or the whole body otherwise.
 * @example await readUpload(request, 'file', 1024 * 1024) // { ok: true, bytes, name: 'licks.abc' }
 */
export async function readUpload(
	request: Request,
	field: string,
	maxBytes: number
): Promise<Upload> {
	const tooLarge = {
		ok: false,
		status: 413,
		message: `The file is larger than ${Math.round((maxBytes / 1024 / 1024) * 10) / 10} MB.`
	} as const;
	// Room for the multipart boundary and headers around the file.
	const envelope = 16 * 1024;
	if (Number(request.headers.get('content-length') ?? 0) > maxBytes + envelope) return tooLarge;
	const type = request.headers.get('content-type') ?? '';
	const raw = await readCapped(request, maxBytes + envelope);
	if (!raw) return tooLarge;
	if (!/^multipart\/form-data/i.test(type)) {
		if (raw.byteLength > maxBytes) return tooLarge;
		return { ok: true, bytes: raw, name: null };
	}
	let form: FormData;
	try {
		form = await new Response(raw as Uint8Array<ArrayBuffer>, {
			headers: { 'content-type': type }
		}).formData();
	} catch {
		return { ok: false, status: 400, message: 'The form data could not be read.' };
	}
	const file = form.get(field);
	if (!file || typeof file === 'string') {
		return { ok: false, status: 400, message: `Send the file in the form field “${field}”.` };
	}
	if (file.size > maxBytes) return tooLarge;
	return { ok: true, bytes: new Uint8Array(await file.arrayBuffer()), name: file.name || null };
}
