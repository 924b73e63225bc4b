import { isQualityId, prepareLick, type HandWrittenVersions } from '../../music/index';
import { readTuneMeta, splitTunes, type TuneText } from '../../library/abc-file';
import type { Actor } from './access';
import { LibraryError } from './errors';
import { createLick, readFeel, readLickInput, type LickInput } from './licks';

/**
 * Import an `.abc` file: each valid tune becomes a lick of the actor's; a tune that fails leaves
 * nothing behind and is reported with its number, title, file line and the reason. A tune our
 * export marked as another tune's hand-written version is saved with that lick.
 */

export const MAX_IMPORT_BYTES = 1024 * 1024;
export const MAX_IMPORT_TUNES = 200;

export interface ImportCreated {
	/** The tune's X: number. */
	tune: number;
	title: string;
	id: string;
	/** Qualities of hand-written versions saved with it. */
	versions: string[];
}

export interface ImportFailed {
	tune: number;
	title: string;
	/** Line in the file (1-based), when the fault has a place. */
	line?: number;
	column?: number;
	message: string;
}

export interface ImportResult {
	created: ImportCreated[];
	failed: ImportFailed[];
}

const titleOf = (t: TuneText) => /^T:(.*)$/m.exec(t.text)?.[1]?.trim() || `Tune ${t.number}`;

/**
 * Import a file's tunes as the actor's licks (private).
 * @example await importAbcFile(user, 'X:1\nT:Up\nK:C\n"C7"CEG|') // { created: [{ tune: 1, … }], failed: [] }
 */
export async function importAbcFile(actor: Actor, file: string): Promise<ImportResult> {
	if (Buffer.byteLength(file, 'utf8') > MAX_IMPORT_BYTES) {
		throw new LibraryError(413, 'An import file is at most 1 MB.');
	}
	const tunes = splitTunes(file.replace(/\r\n?/g, '\n'));
	if (!tunes.length) {
		throw new LibraryError(422, 'The file holds no tune: each tune starts with an X: line.');
	}
	if (tunes.length > MAX_IMPORT_TUNES) {
		throw new LibraryError(
			422,
			`The file holds ${tunes.length} tunes; import at most ${MAX_IMPORT_TUNES} at a time.`
		);
	}
	const result: ImportResult = { created: [], failed: [] };
	// Hand-written versions first gathered by the tune they belong to.
	const versionsOf = new Map<number, { quality: string; abc: string; tune: TuneText }[]>();
	const mains: { tune: TuneText; abc: string; meta: ReturnType<typeof readTuneMeta>['meta'] }[] =
		[];
	for (const tune of tunes) {
		const { abc, meta } = readTuneMeta(tune.text);
		if (meta.versionOf) {
			const list = versionsOf.get(meta.versionOf.tune) ?? [];
			list.push({ quality: meta.versionOf.quality, abc, tune });
			versionsOf.set(meta.versionOf.tune, list);
		} else {
			mains.push({ tune, abc, meta });
		}
	}
	const fail = (tune: TuneText, message: string, line?: number, column?: number) =>
		result.failed.push({
			tune: tune.number,
			title: titleOf(tune),
			...(line !== undefined ? { line: tune.line + line - 1 } : {}),
			...(column !== undefined ? { column } : {}),
			message
		});
	for (const { tune, abc, meta } of mains) {
		// The tune as written in the file gives positions that match the file's lines.
		const read = prepareLick(tune.text);
		if (!read.ok) {
			fail(tune, read.error.message, read.error.line, read.error.column);
			continue;
		}
		const versions: HandWrittenVersions = {};
		let versionFault = false;
		for (const v of versionsOf.get(tune.number) ?? []) {
			const parsed = prepareLick(v.tune.text);
			if (!isQualityId(v.quality)) {
				fail(v.tune, `“${v.quality}” is not a chord quality, so this version was not saved.`);
				versionFault = true;
			} else if (!parsed.ok) {
				fail(v.tune, parsed.error.message, parsed.error.line, parsed.error.column);
				versionFault = true;
			} else {
				versions[v.quality] = v.abc;
			}
		}
		if (versionFault) {
			fail(tune, 'Not imported: one of its hand-written versions has an error (see below it).');
			continue;
		}
		let input: LickInput;
		try {
			input = readLickInput({
				abc,
				title: titleOf(tune),
				...(meta.tags.length ? { tags: meta.tags } : {}),
				...(meta.note ? { note: meta.note } : {}),
				...(Object.keys(versions).length ? { versions } : {})
			});
			if (meta.feel !== null) input.feel = readFeel(meta.feel);
			const lick = await createLick(actor, input);
			result.created.push({
				tune: tune.number,
				title: lick.title,
				id: lick.id,
				versions: Object.keys(versions)
			});
		} catch (e) {
			if (!(e instanceof LibraryError)) throw e;
			fail(tune, e.message, e.details.line, e.details.column);
		}
	}
	// Versions whose tune is not in the file.
	const numbers = new Set(mains.map((m) => m.tune.number));
	for (const [n, list] of versionsOf) {
		if (numbers.has(n)) continue;
		for (const v of list)
			fail(v.tune, `This is a hand-written version of tune ${n}, which is not in the file.`);
	}
	result.failed.sort((a, b) => (a.line ?? 0) - (b.line ?? 0) || a.tune - b.tune);
	return result;
}
