import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/http/json';
import { readUpload } from '$lib/server/http/upload';
import { withActor } from '$lib/server/library/api';
import { importAbcFile, MAX_IMPORT_BYTES } from '$lib/server/library/import';
import type { RequestHandler } from './$types';

/**
 * `POST /api/licks/import` multipart with the `.abc` file in field `file` → 200
 * `{created: [{tune, title, id, versions}], failed: [{tune, title, line?, column?, message}]}`.
 * Each valid tune becomes a private lick; a failed tune leaves nothing. 413 over 1 MB; 422 no
 * tune or more than 200; 400 no file or not UTF-8 text.
 */
export const POST: RequestHandler = ({ locals, request }) =>
	withActor(locals, async (actor) => {
		const upload = await readUpload(request, 'file', MAX_IMPORT_BYTES);
		if (!upload.ok) return apiError(upload.status, upload.message);
		let text: string;
		try {
			text = new TextDecoder('utf-8', { fatal: true }).decode(upload.bytes);
		} catch {
			return apiError(400, 'The file is not text in UTF-8: save it as a plain .abc text file.');
		}
		return json(await importAbcFile(actor, text), { status: 200 });
	});
