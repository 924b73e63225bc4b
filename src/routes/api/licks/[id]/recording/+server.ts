import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/http/json';
import { readUpload } from '$lib/server/http/upload';
import { withActor } from '$lib/server/library/api';
import { getLick } from '$lib/server/library/licks';
import {
	deleteRecording,
	MAX_RECORDING_BYTES,
	putRecording,
	recordingResponse
} from '$lib/server/library/recordings';
import type { RequestHandler } from './$types';

/**
 * `GET /api/licks/:id/recording` → the reference recording, honouring `Range` (206 with
 * `Content-Range`, 416 out of range); 404 when there is none or the lick is not the actor's to see.
 */
export const GET: RequestHandler = ({ locals, params, request }) =>
	withActor(locals, async (actor) =>
		recordingResponse(actor, await getLick(actor, params.id), request.headers.get('range'))
	);

/**
 * `PUT /api/licks/:id/recording` with the audio as the body (or multipart field `file`) → 200
 * `{type, size}`. mp3, ogg, m4a or wav recognised by their bytes (415 otherwise), at most 10 MB
 * (413). Only the author (403; 404 when not the actor's to see).
 */
export const PUT: RequestHandler = ({ locals, params, request }) =>
	withActor(locals, async (actor) => {
		// Access first, so a stranger learns nothing from how the upload is judged.
		await getLick(actor, params.id);
		const upload = await readUpload(request, 'file', MAX_RECORDING_BYTES);
		if (!upload.ok) return apiError(upload.status, upload.message);
		return json(await putRecording(actor, params.id, upload.bytes), { status: 200 });
	});

/** `DELETE /api/licks/:id/recording` → 204. Only the author. */
export const DELETE: RequestHandler = ({ locals, params }) =>
	withActor(locals, async (actor) => {
		await deleteRecording(actor, params.id);
		return new Response(null, { status: 204 });
	});
