/**
 * A lick library's abc files: splitting a file into tunes, reading and writing the header fields
 * a lick keeps in its own text (title `T:`, tempo `Q:`), and the few directives our export adds
 * so that a file imports back to the same licks. Pure and framework-free (the editor uses the
 * header helpers in the browser; import and export run on the server).
 *
 * Our directives are `%%` lines (abc 2.1 §11: a program ignores directives it does not know),
 * so an exported file stays a plain abc file any other reader accepts:
 * `%%twelvefold-tags enclosure, blues`, `%%twelvefold-feel 2`,
 * `%%twelvefold-version-of 3 m7` (this tune is the hand-written m7 version of tune X:3).
 * The teaching note travels in `N:` lines, the standard's notes field (abc 2.1 §3.1.13).
 */

/** One tune of a file: its text, the file line it starts on (1-based) and its X: number. */
export interface TuneText {
	text: string;
	/** File line of the tune's `X:` line. */
	line: number;
	/** The `X:` reference number, or the tune's place in the file when X: is not a number. */
	number: number;
}

/**
 * A file's tunes. A tune starts at an `X:` line and ends at the first empty line (abc 2.1 §2.2);
 * text outside tunes (a file header, free text) is left out. Lines holding only a `%` comment do
 * not end a tune (abc 2.1 §2.2.5).
 * @example splitTunes('X:1\nK:C\nC\n\nX:2\nK:G\nG').map((t) => t.number) // [1, 2]
 */
export function splitTunes(file: string): TuneText[] {
	const lines = file.replace(/^\uFEFF/, '').split(/\r?\n/);
	const tunes: TuneText[] = [];
	let current: { lines: string[]; line: number; number: number } | null = null;
	const close = () => {
		if (current)
			tunes.push({ text: current.lines.join('\n'), line: current.line, number: current.number });
		current = null;
	};
	lines.forEach((text, i) => {
		if (/^X:/.test(text)) {
			close();
			const n = Number(text.slice(2).trim());
			current = {
				lines: [text],
				line: i + 1,
				number: Number.isInteger(n) && n >= 0 ? n : tunes.length + 1
			};
			return;
		}
		if (!current) return;
		if (text.trim() === '') {
			close();
			return;
		}
		current.lines.push(text);
	});
	close();
	return tunes;
}

/** Index of the header's `K:` line (the header ends there), or -1. */
function keyLineIndex(lines: string[]): number {
	return lines.findIndex((l) => /^K:/.test(l));
}

/**
 * The value of the first header field `field` (one letter), trimmed, or null.
 * @example readHeaderField('X:1\nT:Blue turn\nK:C\nc', 'T') // 'Blue turn'
 */
export function readHeaderField(abc: string, field: string): string | null {
	const lines = abc.split('\n');
	const end = keyLineIndex(lines);
	const head = end < 0 ? lines : lines.slice(0, end + 1);
	const found = head.find((l) => l.startsWith(`${field}:`));
	return found === undefined ? null : found.slice(field.length + 1).trim();
}

/**
 * The abc with its first header field `field` set to `value` (added when missing: a title right
 * after `X:`, anything else just before `K:`).
 * @example setHeaderField('X:1\nK:C\nc', 'T', 'Up') // 'X:1\nT:Up\nK:C\nc'
 */
export function setHeaderField(abc: string, field: string, value: string): string {
	const lines = abc.split('\n');
	const end = keyLineIndex(lines);
	const limit = end < 0 ? lines.length : end;
	const at = lines.slice(0, limit).findIndex((l) => l.startsWith(`${field}:`));
	const line = `${field}:${value}`;
	if (at >= 0) {
		lines[at] = line;
	} else if (field === 'T' && /^X:/.test(lines[0] ?? '')) {
		lines.splice(1, 0, line);
	} else {
		lines.splice(limit, 0, line);
	}
	return lines.join('\n');
}

/**
 * Quarter notes a minute from the header's `Q:` (`Q:1/4=132`, `Q:3/8=60`, a bare `Q:120`), or null.
 * @example readTempo('X:1\nQ:1/4=132\nK:C\nc') // 132
 */
export function readTempo(abc: string): number | null {
	const q = readHeaderField(abc, 'Q');
	if (q === null) return null;
	const m = /^(?:"[^"]*"\s*)?(?:(\d+)\/(\d+)\s*=\s*)?(\d+)(?:\s*"[^"]*")?$/.exec(q);
	if (!m) return null;
	const beat = m[1] ? Number(m[1]) / Number(m[2]) : 0.25;
	const quarters = Math.round((Number(m[3]) * beat) / 0.25);
	return Number.isFinite(quarters) && quarters > 0 ? quarters : null;
}

/** A lick's own fields as an exported tune carries them. */
export interface TuneMeta {
	tags: string[];
	/** Swing ratio (1 straight), when the tune says. */
	feel: number | null;
	/** Teaching note (Markdown) from the header's `N:` lines, joined by newlines. */
	note: string;
	/** When this tune is a hand-written version of another tune of the file. */
	versionOf: { tune: number; quality: string } | null;
}

const DIRECTIVE = /^%%twelvefold-([a-z-]+)\s*(.*)$/;

/**
 * A tune's text without our directives and header notes, and what they said. Lines are replaced
 * by nothing (not removed) only in the header, so the music's own lines keep their text.
 * @example readTuneMeta('X:1\n%%twelvefold-feel 1\nK:C\nc').meta.feel // 1
 */
export function readTuneMeta(text: string): { abc: string; meta: TuneMeta } {
	const lines = text.split('\n');
	const end = keyLineIndex(lines);
	const meta: TuneMeta = { tags: [], feel: null, note: '', versionOf: null };
	const notes: string[] = [];
	const kept: string[] = [];
	lines.forEach((line, i) => {
		const inHeader = end < 0 || i < end;
		const d = inHeader ? DIRECTIVE.exec(line) : null;
		if (d) {
			const [, name, value] = d;
			if (name === 'tags') {
				meta.tags = value
					.split(',')
					.map((t) => t.trim())
					.filter(Boolean);
			} else if (name === 'feel') {
				const n = Number(value.trim());
				meta.feel = Number.isFinite(n) ? n : null;
			} else if (name === 'version-of') {
				const m = /^(\d+)\s+(\S+)$/.exec(value.trim());
				if (m) meta.versionOf = { tune: Number(m[1]), quality: m[2] };
			}
			return;
		}
		if (inHeader && line.startsWith('N:')) {
			notes.push(line.slice(2).replace(/^ /, ''));
			return;
		}
		kept.push(line);
	});
	meta.note = notes.join('\n');
	if (kept.length && /^X:/.test(kept[0])) kept[0] = 'X:1';
	return { abc: kept.join('\n'), meta };
}

/** What an exported tune is made of. */
export interface TuneSource {
	title: string;
	abc: string;
	tags: readonly string[];
	feel: number;
	note: string;
}

/** The abc with its `X:` line numbered `n` (added when missing). */
function numbered(abc: string, n: number): string {
	const lines = abc.replace(/\s+$/, '').split('\n');
	if (/^X:/.test(lines[0] ?? '')) lines[0] = `X:${n}`;
	else lines.unshift(`X:${n}`);
	return lines.join('\n');
}

/** Our header lines, placed right after `X:` and `T:`. */
function withHeaderLines(abc: string, extra: string[]): string {
	if (!extra.length) return abc;
	const lines = abc.split('\n');
	const at = lines[1]?.startsWith('T:') ? 2 : 1;
	lines.splice(at, 0, ...extra);
	return lines.join('\n');
}

/**
 * One lick as a tune of an exported file, numbered `n`, with its hand-written versions as the
 * tunes after it; `readTuneMeta` and the importer read it back to the same lick.
 * @example writeTunes({ title: 'Up', abc: 'X:1\nK:C\nc', tags: [], feel: 2, note: '' }, {}, 4)
 * // { text: 'X:4\nT:Up\n%%twelvefold-feel 2\nK:C\nc', next: 5 }
 */
export function writeTunes(
	lick: TuneSource,
	versions: Readonly<Record<string, string>>,
	n: number
): { text: string; next: number } {
	const extra: string[] = [];
	if (lick.tags.length) extra.push(`%%twelvefold-tags ${lick.tags.join(', ')}`);
	extra.push(`%%twelvefold-feel ${lick.feel}`);
	if (lick.note.trim()) for (const line of lick.note.split(/\r?\n/)) extra.push(`N:${line}`);
	const main = withHeaderLines(setHeaderField(numbered(lick.abc, n), 'T', lick.title), extra);
	const parts = [main];
	let next = n + 1;
	for (const [quality, abc] of Object.entries(versions)) {
		parts.push(withHeaderLines(numbered(abc, next), [`%%twelvefold-version-of ${n} ${quality}`]));
		next += 1;
	}
	return { text: parts.join('\n\n'), next };
}
