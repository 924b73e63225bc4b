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

/** Kinds of token that carry nothing beyond their text. */
type PlainKind =
	| 'comment' // `% ...` to the end of a line
	| 'newline'
	| 'blank' // an empty line (ends a tune, abc 2.1 §2.2)
	| 'text' // free text outside a tune
	| 'space'
	| 'continuation' // a trailing `\` joining music lines (§2.2.6)
	| 'chord-open' // `[`
	| 'bar' // `|`, `||`, `|]`, `[|`, `|:`, `:|`, `::`, `|1`, `:|2`, `[2`
	| 'tie' // `-`
	| 'slur-open'
	| 'slur-close'
	| 'grace-open' // `{` or `{/`
	| 'grace-close'
	| 'broken-rhythm' // `>`, `>>`, `<`
	| 'ignored'; // `y`, backquote, `$`, and the reserved `# * ; ? @` (§8.1)

/** What a token is, by kind, with the parts that kind carries. */
export type TokenData =
	| {
			kind: 'note';
			/** Accidental text (`^`, `__`, `=` or ''). */
			accidental: string;
			/** The letter as written (`C`, `c`). */
			letter: string;
			/** The octave marks (`''`, `,,`). */
			octave: string;
			/** The length text (`3/2`, `/`, ''). */
			length: string;
	  }
	| { kind: 'rest'; /** `z`, `x`, `Z` or `X`. */ letter: string; length: string }
	| { kind: 'chord-close'; /** `]` with any chord length after it: `]2`. */ length: string }
	| { kind: 'field'; /** The field letter. */ name: string; value: string }
	| { kind: 'inline-field'; /** `[K:Eb]` inside music. */ name: string; value: string }
	| { kind: 'directive'; /** `%%propagate-accidentals octave` without `%%`. */ value: string }
	| { kind: 'chord-symbol'; /** `"Bb7"` without quotes (§4.18). */ value: string }
	| { kind: 'annotation'; /** `"^solo"` without quotes (§4.19). */ value: string }
	| {
			kind: 'decoration';
			/** `!trill!`, `+trill+`, `.`, `~`, `T` … without delimiters. */ value: string;
	  }
	| {
			kind: 'tuplet';
			/** `(3`, `(3:2:3`: p, q and r (0 when not given). */ tuplet: [number, number, number];
	  }
	| { kind: PlainKind };

export type TokenKind = TokenData['kind'];

/** A token with its exact source text and where it stands. */
export type Token = TokenData & {
	/** The exact source text of the token. */
	text: string;
	/** Offset of the first character in the input (UTF-16 units). */
	offset: number;
	/** 1-based line and column of the first character. */
	line: number;
	column: number;
};

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
		const push = (data: TokenData, from: number, to: number): Token => {
			const t: Token = {
				...data,
				text: input.slice(lineStart + from, lineStart + to),
				offset: lineStart + from,
				line: lineNo,
				column: from + 1
			};
			tokens.push(t);
			return t;
		};
		const fieldMatch = /^([A-Za-z+]):/.exec(line);
		if (line.trim() === '') {
			if (line.length > 0 || state !== 'free' || tokens.length > 0)
				push({ kind: 'blank' }, 0, line.length);
			if (state === 'body' || state === 'header') state = 'free';
		} else if (line.startsWith('%%')) {
			push({ kind: 'directive', value: line.slice(2).trim() }, 0, line.length);
		} else if (line.startsWith('%')) {
			push({ kind: 'comment' }, 0, line.length);
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
			push({ kind: 'field', name, value: line.slice(2, valueEnd) }, 0, valueEnd);
			if (commentAt >= 0) push({ kind: 'comment' }, commentAt, line.length);
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
			push({ kind: 'text' }, 0, line.length);
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

type Push = (data: TokenData, from: number, to: number) => Token;

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
			push({ kind: 'space' }, i, j);
			i = j;
			continue;
		}
		if (c === '%') {
			push({ kind: 'comment' }, i, line.length);
			i = line.length;
			continue;
		}
		if (c === '\\') {
			const after = line.slice(i + 1);
			if (after.trim() === '' || after.trimStart().startsWith('%')) {
				push({ kind: 'continuation' }, i, i + 1);
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
			const kind: 'annotation' | 'chord-symbol' = /^[\^_<>@]/.test(value)
				? 'annotation'
				: 'chord-symbol';
			push({ kind, value }, i, close + 1);
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
			push({ kind: 'decoration', value: line.slice(i + 1, close) }, i, close + 1);
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
				push(
					{ kind: 'inline-field', name: line[i + 1], value: line.slice(i + 3, close) },
					i,
					close + 1
				);
				i = close + 1;
				continue;
			}
			if (line[i + 1] === '|' || /\d/.test(line[i + 1] ?? '')) {
				BAR_RE.lastIndex = i;
				const m = BAR_RE.exec(line);
				if (m && chordOpen === null) {
					push({ kind: 'bar' }, i, i + m[0].length);
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
			push({ kind: 'chord-open' }, i, i + 1);
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
			push({ kind: 'chord-close', length }, i, i + 1 + length.length);
			chordOpen = null;
			i += 1 + length.length;
			continue;
		}
		if (c === '|' || (c === ':' && (line[i + 1] === '|' || line[i + 1] === ':'))) {
			if (chordOpen !== null) break;
			BAR_RE.lastIndex = i;
			const m = BAR_RE.exec(line);
			if (m) {
				push({ kind: 'bar' }, i, i + m[0].length);
				i += m[0].length;
				continue;
			}
		}
		NOTE_RE.lastIndex = i;
		const note = NOTE_RE.exec(line);
		if (note) {
			push(
				{
					kind: 'note',
					accidental: note[1] ?? '',
					letter: note[2],
					octave: note[3],
					length: note[4]
				},
				i,
				i + note[0].length
			);
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
			push(
				{ kind: 'rest', letter: rest[1] ?? rest[3], length: rest[2] ?? rest[4] },
				i,
				i + rest[0].length
			);
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
				push(
					{ kind: 'tuplet', tuplet: [p, Number(t[2] || 0), Number(t[3] || 0)] },
					i,
					i + t[0].length
				);
				i += t[0].length;
				continue;
			}
			push({ kind: 'slur-open' }, i, i + 1);
			i++;
			continue;
		}
		if (c === ')') {
			push({ kind: 'slur-close' }, i, i + 1);
			i++;
			continue;
		}
		if (c === '{') {
			if (graceOpen !== null)
				return err('Grace notes cannot be nested: close the first { with }.', i);
			graceOpen = i;
			const to = line[i + 1] === '/' ? i + 2 : i + 1;
			push({ kind: 'grace-open' }, i, to);
			i = to;
			continue;
		}
		if (c === '}') {
			if (graceOpen === null)
				return err('This } closes no grace notes: there is no { before it.', i);
			graceOpen = null;
			push({ kind: 'grace-close' }, i, i + 1);
			i++;
			continue;
		}
		if (c === '-') {
			push({ kind: 'tie' }, i, i + 1);
			i++;
			continue;
		}
		if (c === '>' || c === '<') {
			let j = i;
			while (j < line.length && line[j] === c && j - i < 3) j++;
			push({ kind: 'broken-rhythm' }, i, j);
			i = j;
			continue;
		}
		if (DECORATION_CHARS.includes(c)) {
			push({ kind: 'decoration', value: c }, i, i + 1);
			i++;
			continue;
		}
		if (USER_DECORATIONS.test(c)) {
			warnings.push({
				message: `“${c}” is not a standard decoration symbol; it is kept but means nothing unless a U: field defines it.`,
				line: lineNo,
				column: i + 1
			});
			push({ kind: 'decoration', value: c }, i, i + 1);
			i++;
			continue;
		}
		if (c === 'y' || c === '`' || c === '$') {
			push({ kind: 'ignored' }, i, i + 1);
			i++;
			continue;
		}
		if ('#*;?@'.includes(c)) {
			warnings.push({
				message: `“${c}” is reserved in abc music and is ignored.`,
				line: lineNo,
				column: i + 1
			});
			push({ kind: 'ignored' }, i, i + 1);
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
