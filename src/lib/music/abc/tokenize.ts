/**
 * A positioned tokenizer for abc 2.1 licks.
 *
 * Why our own and not abcjs's parser: abcjs `parseOnly` returns an engraving model. It drops the
 * source text between elements (spacing, comments, line continuations, the exact spelling of
 * lengths such as `A3/2`), keeps character positions only for some elements, folds chord
 * symbols and annotations into one list, and reports syntax problems as loose warnings rather
 * than positioned errors. Re-emitting a transposed lick that is byte-for-byte the input wherever
 * no pitch changed needs every character, and a lick editor needs a line and a column for each
 * error (abc 2.1 §12.2 "strict" reading). abcjs stays in the tests as a cross-check of pitches.
 *
 * The token list covers the input exactly: joining every token's `text` gives the input back.
 */

/** Largest input accepted, in bytes of UTF-8 (20 KB). */
export const MAX_ABC_BYTES = 20 * 1024;

export type TokenKind =
	| 'field' // a whole header or body field line without its newline: `K:Bb`
	| 'inline-field' // `[K:Eb]` inside music
	| 'directive' // `%%propagate-accidentals octave`
	| 'comment' // `% ...` to the end of a line
	| 'newline'
	| 'blank' // an empty line (ends a tune, abc 2.1 §2.2)
	| 'text' // free text outside a tune
	| 'space'
	| 'continuation' // a trailing `\` joining music lines (§2.2.6)
	| 'note'
	| 'rest'
	| 'chord-open' // `[`
	| 'chord-close' // `]` with any chord length after it: `]2`
	| 'chord-symbol' // `"Bb7"` (§4.18)
	| 'annotation' // `"^solo"` (§4.19)
	| 'bar' // `|`, `||`, `|]`, `[|`, `|:`, `:|`, `::`, `|1`, `:|2`, `[2`
	| 'tie' // `-`
	| 'slur-open'
	| 'slur-close'
	| 'tuplet' // `(3`, `(3:2:3`
	| 'grace-open' // `{` or `{/`
	| 'grace-close'
	| 'decoration' // `!trill!`, `+trill+`, `.`, `~`, `T` …
	| 'broken-rhythm' // `>`, `>>`, `<`
	| 'ignored'; // `y`, backquote, `$`, and the reserved `# * ; ? @` (§8.1)

export interface Token {
	kind: TokenKind;
	/** The exact source text of the token. */
	text: string;
	/** Offset of the first character in the input (UTF-16 units). */
	offset: number;
	/** 1-based line and column of the first character. */
	line: number;
	column: number;
	/** Note: accidental text (`^`, `__`, `=` or ''). */
	accidental?: string;
	/** Note or rest: the letter as written (`C`, `c`, `z`, `Z`). */
	letter?: string;
	/** Note: the octave marks (`''`, `,,`). */
	octave?: string;
	/** Note, rest, chord close: the length text (`3/2`, `/`, ''). */
	length?: string;
	/** Field, inline field: the field letter. */
	name?: string;
	/** Field, inline field, chord symbol, annotation, decoration, directive: the content. */
	value?: string;
	/** Tuplet: p, q (0 when not given) and r (0 when not given). */
	tuplet?: [number, number, number];
}

export interface AbcError {
	/** A sentence a teacher understands. */
	message: string;
	line: number;
	column: number;
}

export type TokenizeResult =
	| { ok: true; tokens: Token[]; warnings: { message: string; line: number; column: number }[] }
	| { ok: false; error: AbcError };

/** Field letters that may stand on their own line inside a tune body (abc 2.1 §3, table). */
const BODY_FIELDS = 'IKLMmNPQRrsTUVWw';
const DECORATION_CHARS = '.~HLMOPSTuv';
/** Letters that abc 2.1 §4.16 lets a `U:` field redefine as decorations. */
const USER_DECORATIONS = /[H-Wh-w]/;

/**
 * Split abc text into positioned tokens that together spell the input exactly.
 * @example tokenize('X:1\nK:C\nC2|').ok // true
 */
export function tokenize(input: string): TokenizeResult {
	const bytes = new TextEncoder().encode(input).length;
	if (bytes > MAX_ABC_BYTES) {
		return {
			ok: false,
			error: {
				message: `The abc text is ${(bytes / 1024).toFixed(1)} KB; a lick may be at most 20 KB.`,
				line: 1,
				column: 1
			}
		};
	}
	const tokens: Token[] = [];
	const warnings: { message: string; line: number; column: number }[] = [];
	let state: 'free' | 'header' | 'body' = 'free';
	let sawTune = false;
	let offset = 0;
	let lineNo = 0;
	// A music line ending in `\` continues on the next line even across a comment line (§2.2.6).
	while (offset < input.length) {
		lineNo++;
		let end = input.indexOf('\n', offset);
		if (end < 0) end = input.length;
		const lineStart = offset;
		const contentEnd = end > offset && input[end - 1] === '\r' ? end - 1 : end;
		const line = input.slice(lineStart, contentEnd);
		const push = (kind: TokenKind, from: number, to: number, extra?: Partial<Token>): Token => {
			const t: Token = {
				kind,
				text: input.slice(lineStart + from, lineStart + to),
				offset: lineStart + from,
				line: lineNo,
				column: from + 1,
				...extra
			};
			tokens.push(t);
			return t;
		};
		const fieldMatch = /^([A-Za-z+]):/.exec(line);
		if (line.trim() === '') {
			if (line.length > 0 || state !== 'free' || tokens.length > 0) push('blank', 0, line.length);
			if (state === 'body' || state === 'header') state = 'free';
		} else if (line.startsWith('%%')) {
			push('directive', 0, line.length, { value: line.slice(2).trim() });
		} else if (line.startsWith('%')) {
			push('comment', 0, line.length);
		} else if (
			fieldMatch &&
			(state !== 'body' || BODY_FIELDS.includes(fieldMatch[1]) || fieldMatch[1] === '+')
		) {
			const name = fieldMatch[1];
			if (name === 'X') state = 'header';
			else if (state === 'free') state = 'header';
			// A field value ends at a `%` comment (abc 2.1 §2.2.5), except in the text fields.
			const commentAt = findComment(line, 2);
			const valueEnd = commentAt < 0 ? line.length : commentAt;
			push('field', 0, valueEnd, { name, value: line.slice(2, valueEnd) });
			if (commentAt >= 0) push('comment', commentAt, line.length);
			if (name === 'K' && state === 'header') {
				state = 'body';
				sawTune = true;
			}
		} else if (state === 'body') {
			const error = tokenizeMusicLine(line, push, warnings, lineNo);
			if (error) return { ok: false, error };
		} else if (state === 'header') {
			return {
				ok: false,
				error: {
					message:
						'Music starts before the K: line; the header must end with a K: field (for example K:C) before the first notes.',
					line: lineNo,
					column: 1
				}
			};
		} else {
			// Free text between tunes is allowed (§2.2), but after a tune it is most often music
			// cut off by a stray empty line: say so rather than drop the notes in silence.
			if (sawTune && /[A-Ga-g]/.test(line)) {
				warnings.push({
					message:
						'This line comes after an empty line, which ends the tune (abc 2.1 §2.2), so it is not read as music; remove the empty line to continue the tune.',
					line: lineNo,
					column: 1
				});
			}
			push('text', 0, line.length);
		}
		if (end < input.length) {
			const t: Token = {
				kind: 'newline',
				text: input.slice(contentEnd, end + 1),
				offset: contentEnd,
				line: lineNo,
				column: contentEnd - lineStart + 1
			};
			tokens.push(t);
		}
		offset = end + 1;
	}
	return { ok: true, tokens, warnings };
}

/** Index of a `%` that starts a comment (not an escaped `\%`), or -1. */
function findComment(line: string, from: number): number {
	for (let i = from; i < line.length; i++) {
		if (line[i] === '%' && line[i - 1] !== '\\') return i;
	}
	return -1;
}

type Push = (kind: TokenKind, from: number, to: number, extra?: Partial<Token>) => Token;

const NOTE_RE = /(\^\^|\^|__|_|=)?([A-Ga-g])([',]*)(\d*\/*\d*)/y;
const REST_RE = /([zx])(\d*\/*\d*)|([ZX])(\d*)/y;
const TUPLET_RE = /\((\d+)(?::(\d*)(?::(\d*))?)?/y;
const BAR_RE = /(?:\[\||:*\|+\]?|::+)[:|]*(?:\d+(?:[,-]\d+)*)?|\[\d+(?:[,-]\d+)*/y;

function tokenizeMusicLine(
	line: string,
	push: Push,
	warnings: { message: string; line: number; column: number }[],
	lineNo: number
): AbcError | null {
	let i = 0;
	let chordOpen: number | null = null;
	let graceOpen: number | null = null;
	const err = (message: string, at: number): AbcError => ({
		message,
		line: lineNo,
		column: at + 1
	});
	while (i < line.length) {
		const c = line[i];
		if (c === ' ' || c === '\t') {
			let j = i;
			while (j < line.length && (line[j] === ' ' || line[j] === '\t')) j++;
			push('space', i, j);
			i = j;
			continue;
		}
		if (c === '%') {
			push('comment', i, line.length);
			i = line.length;
			continue;
		}
		if (c === '\\') {
			const after = line.slice(i + 1);
			if (after.trim() === '' || after.trimStart().startsWith('%')) {
				push('continuation', i, i + 1);
				i++;
				continue;
			}
			return err('A backslash \\ may only end a music line (to continue it on the next line).', i);
		}
		if (c === '"') {
			const close = line.indexOf('"', i + 1);
			if (close < 0) {
				return err(
					'This chord symbol or annotation has no closing double quote ("); close it on the same line.',
					i
				);
			}
			const value = line.slice(i + 1, close);
			const kind = /^[\^_<>@]/.test(value) ? 'annotation' : 'chord-symbol';
			push(kind, i, close + 1, { value });
			i = close + 1;
			continue;
		}
		if (c === '!' || c === '+') {
			const close = line.indexOf(c, i + 1);
			if (close < 0 || close === i + 1) {
				return err(
					`This decoration has no closing ${c}; write decorations as ${c}name${c}, for example ${c}trill${c}.`,
					i
				);
			}
			push('decoration', i, close + 1, { value: line.slice(i + 1, close) });
			i = close + 1;
			continue;
		}
		if (c === '[') {
			const inline = /\[([A-Za-z+]):/y;
			inline.lastIndex = i;
			if (inline.exec(line) && chordOpen === null) {
				const close = line.indexOf(']', i);
				if (close < 0) {
					return err(
						`The inline field [${line[i + 1]}: has no closing ]; write it as [${line[i + 1]}:value].`,
						i
					);
				}
				push('inline-field', i, close + 1, {
					name: line[i + 1],
					value: line.slice(i + 3, close)
				});
				i = close + 1;
				continue;
			}
			if (line[i + 1] === '|' || /\d/.test(line[i + 1] ?? '')) {
				BAR_RE.lastIndex = i;
				const m = BAR_RE.exec(line);
				if (m && chordOpen === null) {
					push('bar', i, i + m[0].length);
					i += m[0].length;
					continue;
				}
			}
			if (chordOpen !== null) {
				return err(
					'A chord cannot start inside another chord: close the first one with ] before this [.',
					i
				);
			}
			chordOpen = i;
			push('chord-open', i, i + 1);
			i++;
			continue;
		}
		if (c === ']') {
			if (chordOpen === null) {
				return err('This ] closes nothing: there is no [ before it on this line.', i);
			}
			const len = /\d*\/*\d*/y;
			len.lastIndex = i + 1;
			const length = len.exec(line)?.[0] ?? '';
			push('chord-close', i, i + 1 + length.length, { length });
			chordOpen = null;
			i += 1 + length.length;
			continue;
		}
		if (c === '|' || (c === ':' && (line[i + 1] === '|' || line[i + 1] === ':'))) {
			if (chordOpen !== null) break;
			BAR_RE.lastIndex = i;
			const m = BAR_RE.exec(line);
			if (m) {
				push('bar', i, i + m[0].length);
				i += m[0].length;
				continue;
			}
		}
		NOTE_RE.lastIndex = i;
		const note = NOTE_RE.exec(line);
		if (note) {
			push('note', i, i + note[0].length, {
				accidental: note[1] ?? '',
				letter: note[2],
				octave: note[3],
				length: note[4]
			});
			i += note[0].length;
			continue;
		}
		if (c === '^' || c === '_' || c === '=') {
			return err(
				`The accidental ${c} must stand right before a note letter (A to G or a to g).`,
				i
			);
		}
		if (chordOpen !== null && c !== '-') {
			return err(
				`Only notes may stand inside a chord [ ]; “${c}” is not a note. Close the chord with ] first.`,
				i
			);
		}
		REST_RE.lastIndex = i;
		const rest = REST_RE.exec(line);
		if (rest) {
			push('rest', i, i + rest[0].length, {
				letter: rest[1] ?? rest[3],
				length: rest[2] ?? rest[4]
			});
			i += rest[0].length;
			continue;
		}
		if (c === '(') {
			TUPLET_RE.lastIndex = i;
			const t = TUPLET_RE.exec(line);
			if (t) {
				const p = Number(t[1]);
				if (p < 2 || p > 9) {
					return err(
						`A tuplet (${p} is not possible: write (2 to (9, for example (3 for triplets.`,
						i
					);
				}
				push('tuplet', i, i + t[0].length, {
					tuplet: [p, Number(t[2] || 0), Number(t[3] || 0)]
				});
				i += t[0].length;
				continue;
			}
			push('slur-open', i, i + 1);
			i++;
			continue;
		}
		if (c === ')') {
			push('slur-close', i, i + 1);
			i++;
			continue;
		}
		if (c === '{') {
			if (graceOpen !== null)
				return err('Grace notes cannot be nested: close the first { with }.', i);
			graceOpen = i;
			const to = line[i + 1] === '/' ? i + 2 : i + 1;
			push('grace-open', i, to);
			i = to;
			continue;
		}
		if (c === '}') {
			if (graceOpen === null)
				return err('This } closes no grace notes: there is no { before it.', i);
			graceOpen = null;
			push('grace-close', i, i + 1);
			i++;
			continue;
		}
		if (c === '-') {
			push('tie', i, i + 1);
			i++;
			continue;
		}
		if (c === '>' || c === '<') {
			let j = i;
			while (j < line.length && line[j] === c && j - i < 3) j++;
			push('broken-rhythm', i, j);
			i = j;
			continue;
		}
		if (DECORATION_CHARS.includes(c)) {
			push('decoration', i, i + 1, { value: c });
			i++;
			continue;
		}
		if (USER_DECORATIONS.test(c)) {
			warnings.push({
				message: `“${c}” is not a standard decoration symbol; it is kept but means nothing unless a U: field defines it.`,
				line: lineNo,
				column: i + 1
			});
			push('decoration', i, i + 1, { value: c });
			i++;
			continue;
		}
		if (c === 'y' || c === '`' || c === '$') {
			push('ignored', i, i + 1);
			i++;
			continue;
		}
		if ('#*;?@'.includes(c)) {
			warnings.push({
				message: `“${c}” is reserved in abc music and is ignored.`,
				line: lineNo,
				column: i + 1
			});
			push('ignored', i, i + 1);
			i++;
			continue;
		}
		if (c === '&') {
			return err('Voice overlay (&) is not supported in a lick; write one melodic line.', i);
		}
		if (/\d|\//.test(c)) {
			return err(
				`The length “${c}” has no note before it; a length follows its note, as in C2 or C/2.`,
				i
			);
		}
		if (c === "'" || c === ',') {
			return err(`The octave mark ${c} must follow a note letter, as in c' or C,.`, i);
		}
		return err(`Unexpected character “${c}” in the music.`, i);
	}
	if (chordOpen !== null) {
		return err(
			'This chord [ is never closed: add ] after its last note, on the same line.',
			chordOpen
		);
	}
	if (graceOpen !== null) {
		return err(
			'These grace notes { are never closed: add } after the last one, on the same line.',
			graceOpen
		);
	}
	return null;
}
