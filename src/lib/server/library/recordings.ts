import { randomBytes } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';

import { Lick } from '../db/models/index';
import { getBlobStore } from '../storage/index';
import type { Actor } from './access';
import { LibraryError } from './errors';
import { getLick } from './licks';

/**
 * A lick's reference recording: one audio file, recognised by its bytes (never by its name or
 * the type the browser claims), kept in the blob store, served in byte ranges so the audio
 * element can seek, only to those who may read the lick.
 */

/** The largest recording accepted. */
export const MAX_RECORDING_BYTES = 10 * 1024 * 1024;

/** Audio types accepted, as `file-type` names them, with the extension stored. */
const ACCEPTED: Record<string, string> = {
	'audio/mpeg': 'mp3',
	'audio/ogg': 'ogg',
	'audio/opus': 'ogg',
	'audio/mp4': 'm4a',
	'audio/x-m4a': 'm4a',
	'audio/aac': 'm4a',
	'audio/wav': 'wav',
	'audio/x-wav': 'wav',
	'audio/vnd.wave': 'wav'
};

/**
 * The audio type of some bytes, or null when they are not mp3, ogg, m4a or wav.
 * @example await detectAudioType(wavBytes) // 'audio/wav'
 */
export async function detectAudioType(bytes: Uint8Array): Promise<string | null> {
	const found = await fileTypeFromBuffer(bytes);
	if (!found) return null;
	// An m4a is an MP4 container: file-type calls audio-only ones audio/x-m4a or audio/mp4 and
	// may call one video/mp4; the extension decides.
	if (found.ext === 'm4a') return 'audio/mp4';
	if (found.mime === 'audio/mpeg' && !hasMpegFrameAfterTag(bytes)) return null;
	return ACCEPTED[found.mime] ? found.mime : null;
}

/**
 * An mp3 recognised by a leading ID3 tag alone could be any file starting "ID3": the tag's own
 * length (a syncsafe integer, ID3v2.4 §3.1) must lead to an MPEG frame sync (11 set bits).
 */
function hasMpegFrameAfterTag(bytes: Uint8Array): boolean {
	if (!(bytes[0] === 0x49 && bytes[1] === 0x44 && bytes[2] === 0x33)) return true;
	if ([6, 7, 8, 9].some((i) => bytes[i] === undefined || bytes[i] > 0x7f)) return false;
	const size = (bytes[6] << 21) | (bytes[7] << 14) | (bytes[8] << 7) | bytes[9];
	const footer = bytes[5] & 0x10 ? 10 : 0;
	const at = 10 + size + footer;
	return at + 1 < bytes.length && bytes[at] === 0xff && (bytes[at + 1] & 0xe0) === 0xe0;
}

/**
 * Store (or replace) the recording of the actor's own lick. 413 over 10 MB, 415 when the bytes
 * are not audio of an accepted kind; nothing changes then.
 * @example await putRecording(user, id, bytes) // { type: 'audio/wav', size: 44 }
 */
export async function putRecording(
	actor: Actor,
	lickId: string,
	bytes: Uint8Array
): Promise<{ type: string; size: number }> {
	const lick = await getLick(actor, lickId);
	if (!lick.mine) throw new LibraryError(403, 'Only its author can change this lick.');
	if (bytes.byteLength === 0)
		throw new LibraryError(400, 'Send the recording as the request body.');
	if (bytes.byteLength > MAX_RECORDING_BYTES) {
		throw new LibraryError(413, 'A recording is at most 10 MB.');
	}
	const type = await detectAudioType(bytes);
	if (!type) {
		throw new LibraryError(415, 'That file is not an mp3, ogg, m4a or wav recording.');
	}
	const store = getBlobStore();
	const key = `recordings/${lick.id}/${randomBytes(8).toString('hex')}.${ACCEPTED[type] ?? 'm4a'}`;
	await store.put(key, bytes, type);
	const before = await Lick.findByPk(lick.id, { attributes: ['recordingKey'] });
	try {
		await Lick.update(
			{ recordingKey: key, recordingType: type, recordingSize: bytes.byteLength },
			{ where: { id: lick.id, authorId: actor.id } }
		);
	} catch (e) {
		await store.delete(key);
		throw e;
	}
	if (before?.recordingKey && before.recordingKey !== key) await store.delete(before.recordingKey);
	return { type, size: bytes.byteLength };
}

/**
 * Remove the recording of the actor's own lick (nothing to remove is fine).
 * @example await deleteRecording(user, id)
 */
export async function deleteRecording(actor: Actor, lickId: string): Promise<void> {
	const lick = await getLick(actor, lickId);
	if (!lick.mine) throw new LibraryError(403, 'Only its author can change this lick.');
	const row = await Lick.findByPk(lick.id, { attributes: ['id', 'recordingKey'] });
	if (!row?.recordingKey) return;
	await Lick.update(
		{ recordingKey: null, recordingType: null, recordingSize: null },
		{ where: { id: lick.id, authorId: actor.id } }
	);
	await getBlobStore().delete(row.recordingKey);
}

/** An HTTP `Range` header read against a size: a byte range, or null for the whole file. */
export function readRange(
	header: string | null,
	size: number
): { start: number; end: number } | null | 'unsatisfiable' {
	if (!header) return null;
	const m = /^bytes=(\d*)-(\d*)$/.exec(header.trim());
	// Several ranges or other units: answer with the whole file (RFC 9110 §14.2 allows ignoring).
	if (!m || (m[1] === '' && m[2] === '')) return null;
	let start: number;
	let end: number;
	if (m[1] === '') {
		const suffix = Number(m[2]);
		if (suffix === 0) return 'unsatisfiable';
		start = Math.max(0, size - suffix);
		end = size - 1;
	} else {
		start = Number(m[1]);
		end = m[2] === '' ? size - 1 : Math.min(Number(m[2]), size - 1);
	}
	if (start >= size || start > end) return 'unsatisfiable';
	return { start, end };
}

/**
 * The recording of a lick the actor (or, for a public lick's share page, anyone: null) may read,
 * as an HTTP answer honouring `Range`: 200 whole, 206 partial, 416 out of range, 404 none.
 * @example await recordingResponse(user, id, 'bytes=0-99') // Response 206
 */
export async function recordingResponse(
	actor: Actor | null,
	lick: { id: string; recording: { type: string } | null },
	rangeHeader: string | null
): Promise<Response> {
	if (!lick.recording) throw new LibraryError(404, 'This lick has no recording.');
	const row = await Lick.findByPk(lick.id, { attributes: ['recordingKey', 'recordingType'] });
	const key = row?.recordingKey;
	const store = getBlobStore();
	const size = key ? await store.size(key) : null;
	if (!key || size === null) throw new LibraryError(404, 'This lick has no recording.');
	const range = readRange(rangeHeader, size);
	const headers: Record<string, string> = {
		'content-type': row.recordingType ?? 'application/octet-stream',
		'accept-ranges': 'bytes',
		// Only people who may read the lick get it: no shared caches.
		'cache-control': actor ? 'private, max-age=300' : 'public, max-age=300'
	};
	if (range === 'unsatisfiable') {
		return new Response(null, {
			status: 416,
			headers: { ...headers, 'content-range': `bytes */${size}` }
		});
	}
	if (range === null) {
		const body = await store.read(key);
		return new Response(body, {
			status: 200,
			headers: { ...headers, 'content-length': String(size) }
		});
	}
	const body = await store.read(key, range);
	return new Response(body, {
		status: 206,
		headers: {
			...headers,
			'content-length': String(range.end - range.start + 1),
			'content-range': `bytes ${range.start}-${range.end}/${size}`
		}
	});
}
