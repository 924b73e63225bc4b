/**
 * From tokens to music: header fields, keys in force, the pitch of every note head under the
 * bar-scoped accidental rule, onsets and durations, ties merged, the chord symbol in force.
 * One pass over the token list; the emitter reuses the result for every target key.
 */
import { parseKeyField, type KeySignature } from '../keys';
import { readTempo } from '../meter';
import { LETTERS, midiOf, type SpelledPitch } from '../pitch';
import type { ChordContext, MusicWarning, SoundingNote } from '../types';
import { tokenize, type AbcError, type Token } from './tokenize';

/** How far an accidental reaches in its bar (abc 2.1 §11.3 `%%propagate-accidentals`). */
export type Propagation = 'pitch' | 'octave' | 'not';

/** Reads a chord symbol (without quotes) into the chord in force; null when it names no chord. */
export type ChordReader = (symbol: string) => ChordContext | null;

/** One note head as written, grace notes and tie continuations included. */
export interface NoteHead {
	/** Index of the note token in `tokens`. */
	token: number;
	pitch: SpelledPitch;
	midi: number;
	grace: boolean;
	/** The sounding note this head starts or continues (tie); -1 for grace notes. */
	sounding: number;
	/** True when a tie from the previous note carries into this head. */
	continuation: boolean;
	/** Index into `keys` of the key signature in force. */
	key: number;
}

export interface ParsedChordSymbol {
	token: number;
	/** The symbol as written, without quotes. */
	text: string;
	context: ChordContext | null;
}

export interface ParsedAbc {
	tokens: Token[];
	/** Every key signature, in order; `keys[0]` is the lick's own key (its first K:). */
	keys: { token: number; key: KeySignature }[];
	meter: string;
	/** Quarter-note beats a minute from the header's `Q:` (abc 2.1 §3.1.8), or null. */
	tempo: number | null;
	/** Unit note length in whole notes (L:, or the default from M:, abc 2.1 §3.1.7). */
	unitLength: number;
	heads: NoteHead[];
	notes: SoundingNote[];
	chordSymbols: ParsedChordSymbol[];
	propagation: Propagation;
	warnings: MusicWarning[];
}

export type ParseResult = { ok: true; tune: ParsedAbc } | { ok: false; error: AbcError };

const ACCIDENTAL_ALT: Readonly<Record<string, number>> = { '^^': 2, '^': 1, '=': 0, _: -1, __: -2 };

/** Header fields of abc 2.1 §3 (table of information fields); anything else warns. */
const KNOWN_FIELDS = 'ABCDFGHIKLMmNOPQRrSsTUVWwXZ+';

interface Element {
	heads: number[];
	/** Duration before tuplet and broken-rhythm factors. */
	base: number;
	factor: number;
	chord: number;
	/** Ties leaving this element: head indices whose next note of the same pitch continues. */
	ties: number[];
	rest: boolean;
}

const fail = (message: string, t: { line: number; column: number }): ParseResult => ({
	ok: false,
	error: { message, line: t.line, column: t.column }
});

/** Meter as whole notes per bar, null for `M:none`; C is 4/4 and C| is 2/2 (abc 2.1 §3.1.6). */
export function meterLength(value: string): number | null | undefined {
	const v = value.trim();
	if (v === 'C') return 1;
	if (v === 'C|') return 1;
	if (v === 'none' || v === '') return null;
	const m = /^\(?([\d+\s]+)\)?\s*\/\s*(\d+)$/.exec(v);
	if (!m) return undefined;
	const num = m[1].split('+').reduce((a, b) => a + Number(b.trim() || 0), 0);
	const den = Number(m[2]);
	if (!num || !den) return undefined;
	return num / den;
}

/**
 * The default unit note length for a meter (abc 2.1 §3.1.7): below 0.75 a sixteenth, otherwise
 * an eighth; `M:C`, `M:C|` and `M:none` give an eighth.
 * @example defaultUnitLength('2/4') // 1/16
 */
export function defaultUnitLength(meter: string): number {
	const v = meter.trim();
	if (v === 'C' || v === 'C|' || v === 'none' || v === '') return 1 / 8;
	const len = meterLength(v);
	return len != null && len < 0.75 ? 1 / 16 : 1 / 8;
}

/**
 * Longest and shortest multiple of the unit length we read. abc 2.1 sets no limit, but a note of
 * `C99999999` is a typing slip, not music, and would make the player wait for days.
 */
export const MAX_LENGTH_MULTIPLIER = 128;

/**
 * A length suffix (`2`, `/`, `3/2`, `//`) as a multiple of the unit; null when malformed or
 * beyond 128 times (or below 1/128 of) the unit.
 * @example lengthMultiplier('3/2') // 1.5
 */
export function lengthMultiplier(text: string): number | null {
	if (text === '') return 1;
	const m = /^(\d*)(\/*)(\d*)$/.exec(text);
	if (!m) return null;
	const num = m[1] === '' ? 1 : Number(m[1]);
	let den = 1;
	if (m[2].length > 0) den = m[3] === '' ? 2 ** m[2].length : Number(m[3]) * 2 ** (m[2].length - 1);
	else if (m[3] !== '') return null;
	if (num === 0 || den === 0) return null;
	const value = num / den;
	if (value > MAX_LENGTH_MULTIPLIER || value < 1 / MAX_LENGTH_MULTIPLIER) return null;
	return value;
}

/** The default q of a tuplet (p:q:r, abc 2.1 §4.13). */
function tupletQ(p: number, meter: string): number {
	if (p === 3 || p === 6) return 2;
	if (p === 2 || p === 4 || p === 8) return 3;
	const m = /^(\d+)\s*\/\s*\d+$/.exec(meter.trim());
	const compound = m !== null && Number(m[1]) % 3 === 0 && Number(m[1]) > 3;
	return compound ? 3 : 2;
}

/**
 * Parse abc text into tokens, keys, note heads and sounding notes.
 * @example parseAbc('X:1\nK:G\nF2|').tune.notes[0].pitch // 'F#4'
 */
export function parseAbc(input: string, readChord?: ChordReader): ParseResult {
	const tokenized = tokenize(input);
	if (!tokenized.ok) return tokenized;
	return readTokens(tokenized.tokens, tokenized.warnings, readChord);
}

function readTokens(
	tokens: Token[],
	tokenWarnings: { message: string; line: number; column: number }[],
	readChord?: ChordReader
): ParseResult {
	const warnings: MusicWarning[] = tokenWarnings.map((w) => ({
		code: 'abc-syntax',
		message: `Line ${w.line}, column ${w.column}: ${w.message}`
	}));
	const keys: { token: number; key: KeySignature }[] = [];
	const heads: NoteHead[] = [];
	const elements: Element[] = [];
	const chordSymbols: ParsedChordSymbol[] = [];
	let propagation: Propagation = 'pitch';
	// Whether the lick says how far its accidentals reach; when it does not, a note that reads
	// differently by letter and by letter-and-octave gets a warning.
	let propagationDeclared = false;
	let readingWarned = false;
	let meter = '';
	let headerMeter = '';
	let tempo: number | null = null;
	let unitLength: number | null = null;
	let headerUnit: number | null = null;
	let inBody = false;
	let currentKey = -1;
	let sawKey = false;
	// Bar-scoped accidentals, both ways: by letter ('pitch') and by letter and octave ('octave').
	let byLetter = new Map<number, number>();
	let byOctave = new Map<number, number>();
	// Alterations tied into the next note, by letter and octave: `^G-|G` is one G♯ (a tie carries
	// its accidental over the bar line, for the tied note only; engraving practice).
	const tieCarry = new Map<number, number>();
	let chordIndex = -1;
	let inChord: Element | null = null;
	let inGrace = false;
	let tuplet: { factor: number; left: number } | null = null;
	let pendingBroken: { prev: number; factor: [number, number] } | null = null;
	let firstBodyToken: Token | null = null;

	const addElement = (el: Element) => {
		if (tuplet) {
			el.factor *= tuplet.factor;
			if (--tuplet.left <= 0) tuplet = null;
		}
		if (pendingBroken) {
			elements[pendingBroken.prev].factor *= pendingBroken.factor[0];
			el.factor *= pendingBroken.factor[1];
			pendingBroken = null;
		}
		elements.push(el);
		tieCarry.clear();
		for (const hi of el.ties) {
			const p = heads[hi].pitch;
			tieCarry.set(p.letter + 7 * (p.octave + 10), p.alt);
		}
	};

	for (let ti = 0; ti < tokens.length; ti++) {
		const t = tokens[ti];
		switch (t.kind) {
			case 'field':
			case 'inline-field': {
				const { name, value } = t;
				if (t.kind === 'field' && name === 'X') {
					inBody = false;
					headerMeter = '';
					headerUnit = null;
					byLetter = new Map();
					byOctave = new Map();
					chordIndex = -1;
				}
				if (!KNOWN_FIELDS.includes(name)) {
					warnings.push({
						code: 'unknown-field',
						message: `Line ${t.line}: the field ${name}: is not an abc 2.1 field and is ignored.`
					});
				}
				if (name === 'V' && inBody && !warnings.some((w) => w.code === 'voices')) {
					warnings.push({
						code: 'voices',
						message: `Line ${t.line}: a lick is read as one line of music; the notes of every voice (V:) are read one after another.`
					});
				}
				if (name === 'Q' && tempo === null) tempo = readTempo(value);
				if (name === 'M') {
					if (meterLength(value) === undefined) {
						return fail(
							`“M:${value.trim()}” is not a meter; write it as M:4/4, M:6/8, M:C or M:none.`,
							t
						);
					}
					meter = value.trim();
					if (!inBody) headerMeter = meter;
				} else if (name === 'L') {
					const m = /^\s*(\d+)\s*(?:\/\s*(\d+))?\s*$/.exec(value);
					if (!m || Number(m[1]) === 0 || (m[2] !== undefined && Number(m[2]) === 0)) {
						return fail(
							`“L:${value.trim()}” is not a note length; write it as L:1/8 or L:1/16.`,
							t
						);
					}
					const len = Number(m[1]) / (m[2] === undefined ? 1 : Number(m[2]));
					// A whole note down to a 1/512: anything else is a slip (and breaks playback).
					if (len > 1 || len < 1 / 512) {
						return fail(
							`“L:${value.trim()}” is outside the lengths we read; use a unit from L:1/1 to L:1/512.`,
							t
						);
					}
					if (inBody) unitLength = len;
					else headerUnit = len;
				} else if (name === 'K') {
					const parsed = parseKeyField(value);
					if (!parsed.ok) {
						const column = t.column + (t.kind === 'inline-field' ? 3 : 2) + parsed.offset;
						return fail(parsed.message, { line: t.line, column });
					}
					keys.push({ token: ti, key: parsed.key });
					currentKey = keys.length - 1;
					if (!inBody && t.kind === 'field') {
						inBody = true;
						sawKey = true;
						meter = headerMeter;
						unitLength = headerUnit ?? defaultUnitLength(headerMeter);
					}
				}
				break;
			}
			case 'directive': {
				const m = /^propagate-accidentals\s+(\S+)/.exec(t.value);
				if (m) {
					if (m[1] === 'pitch' || m[1] === 'octave' || m[1] === 'not') {
						propagation = m[1];
						propagationDeclared = true;
					} else
						warnings.push({
							code: 'unknown-directive',
							message: `Line ${t.line}: %%propagate-accidentals takes not, octave or pitch; “${m[1]}” is ignored.`
						});
				}
				break;
			}
			case 'blank':
				inBody = false;
				break;
			case 'bar':
				byLetter = new Map();
				byOctave = new Map();
				if (inChord) return fail('A bar line cannot stand inside a chord [ ].', t);
				break;
			case 'chord-symbol':
				chordSymbols.push({
					token: ti,
					text: t.value,
					context: readChord ? readChord(t.value) : null
				});
				chordIndex = chordSymbols.length - 1;
				break;
			case 'grace-open':
				inGrace = true;
				break;
			case 'grace-close':
				inGrace = false;
				break;
			case 'chord-open':
				inChord = { heads: [], base: 0, factor: 1, chord: chordIndex, ties: [], rest: false };
				break;
			case 'chord-close': {
				const el = inChord;
				if (!el) return fail('This ] closes no chord: there is no [ before it.', t);
				inChord = null;
				if (el.heads.length === 0) return fail('This chord [ ] holds no notes.', t);
				const mult = lengthMultiplier(t.length);
				if (mult === null) return fail(`“${t.length}” is not a note length.`, t);
				el.base *= mult;
				if (tokens[ti + 1]?.kind === 'tie') el.ties.push(...el.heads);
				addElement(el);
				break;
			}
			case 'note': {
				if (firstBodyToken === null) firstBodyToken = t;
				if (currentKey < 0 || unitLength === null) {
					return fail('Music starts before the K: line; write a K: field first.', t);
				}
				const mult = lengthMultiplier(t.length);
				if (mult === null) {
					return fail(
						`“${t.length}” is not a note length we read: write 2, /2, 3/2 or /, from /128 to 128 units.`,
						t
					);
				}
				const letterText = t.letter;
				const letter = LETTERS.indexOf(letterText.toUpperCase());
				const marks = t.octave;
				let octave = letterText === letterText.toLowerCase() ? 5 : 4;
				for (const ch of marks) octave += ch === "'" ? 1 : -1;
				const acc = t.accidental;
				const slot = letter + 7 * (octave + 10);
				const sig = keys[currentKey].key.accidentals[letter];
				let alt: number;
				const carried = inGrace ? undefined : tieCarry.get(slot);
				if (acc !== '') {
					alt = ACCIDENTAL_ALT[acc];
					byLetter.set(letter, alt);
					byOctave.set(slot, alt);
				} else if (carried !== undefined) {
					alt = carried;
				} else {
					const asPitch = byLetter.get(letter) ?? sig;
					const asOctave = byOctave.get(slot) ?? sig;
					alt = propagation === 'pitch' ? asPitch : propagation === 'octave' ? asOctave : sig;
					if (asPitch !== asOctave && !propagationDeclared && !readingWarned) {
						readingWarned = true;
						warnings.push(readingWarning(t, letter, octave, asPitch, asOctave));
					}
				}
				const pitch = { letter, alt, octave };
				const head: NoteHead = {
					token: ti,
					pitch,
					midi: midiOf(pitch),
					grace: inGrace,
					sounding: -1,
					continuation: false,
					key: currentKey
				};
				heads.push(head);
				const hi = heads.length - 1;
				if (inGrace) break;
				const base = unitLength * mult;
				const tied = tokens[ti + 1]?.kind === 'tie';
				if (inChord) {
					if (inChord.heads.length === 0) inChord.base = base;
					inChord.heads.push(hi);
					if (tied) inChord.ties.push(hi);
				} else {
					addElement({
						heads: [hi],
						base,
						factor: 1,
						chord: chordIndex,
						ties: tied ? [hi] : [],
						rest: false
					});
				}
				break;
			}
			case 'rest': {
				if (currentKey < 0 || unitLength === null) {
					return fail('Music starts before the K: line; write a K: field first.', t);
				}
				let base: number;
				if (t.letter === 'Z' || t.letter === 'X') {
					const bars = t.length === '' ? 1 : Number(t.length);
					if (!(bars >= 1 && bars <= 999)) {
						return fail(`A rest of “${t.length}” bars is more than we read; use 1 to 999.`, t);
					}
					base = bars * (meterLength(meter) ?? 1);
				} else {
					const mult = lengthMultiplier(t.length);
					if (mult === null) return fail(`“${t.length}” is not a rest length.`, t);
					base = unitLength * mult;
				}
				if (!inGrace)
					addElement({ heads: [], base, factor: 1, chord: chordIndex, ties: [], rest: true });
				break;
			}
			case 'tuplet': {
				const [p, q, r] = t.tuplet;
				tuplet = { factor: (q || tupletQ(p, meter)) / p, left: r || p };
				break;
			}
			case 'broken-rhythm': {
				if (elements.length === 0 || inChord) {
					return fail(`The broken rhythm ${t.text} needs a note on each side, as in A>B.`, t);
				}
				const n = t.text.length;
				const long = 2 - 1 / 2 ** n;
				const short = 1 / 2 ** n;
				pendingBroken = {
					prev: elements.length - 1,
					factor: t.text[0] === '>' ? [long, short] : [short, long]
				};
				break;
			}
			default:
				break;
		}
	}
	if (!sawKey) {
		const at = tokens.find((t) => t.kind !== 'blank' && t.kind !== 'newline') ?? {
			line: 1,
			column: 1
		};
		return fail(
			'No K: line found: a lick needs a header that ends with a key, for example X:1, T:My lick, M:4/4, L:1/8, K:C, and then the notes.',
			at
		);
	}
	if (heads.length === 0) {
		const k = tokens[keys[0].token];
		return fail('The tune has no notes: write at least one note after the K: line.', {
			line: k.line + 1,
			column: 1
		});
	}
	if (pendingBroken) {
		const t = tokens.findLast((x) => x.kind === 'broken-rhythm');
		const text = t?.text ?? '>';
		return fail(
			`The broken rhythm ${text} needs a note after it, as in A>B.`,
			t ?? { line: 1, column: 1 }
		);
	}

	// Second pass: onsets, tie merging, sounding notes.
	const notes: SoundingNote[] = [];
	let time = 0;
	let pending: number[] = [];
	for (const el of elements) {
		const dur = el.base * el.factor;
		const carried = new Set<number>();
		for (const hi of el.heads) {
			const head = heads[hi];
			const from = pending.find((p) => heads[p].midi === head.midi && !carried.has(p));
			if (from !== undefined) {
				carried.add(from);
				head.continuation = true;
				head.sounding = heads[from].sounding;
				notes[head.sounding].duration += dur;
			} else {
				head.sounding = notes.length;
				const chord = el.chord >= 0 ? chordSymbols[el.chord].context : null;
				notes.push({
					index: notes.length,
					pitch: formatHeadPitch(head.pitch),
					midi: head.midi,
					start: time,
					duration: dur,
					chord
				});
			}
		}
		if (pending.length > carried.size) {
			warnings.push({
				code: 'tie-unmatched',
				message: 'A tie (-) leads to a note of a different pitch; it is read as two separate notes.'
			});
		}
		pending = el.ties;
		time += dur;
	}
	if (pending.length > 0) {
		warnings.push({ code: 'tie-unmatched', message: 'The last tie (-) leads to no note.' });
	}
	return {
		ok: true,
		tune: {
			tokens,
			keys,
			meter: headerMeter,
			tempo,
			unitLength: headerUnit ?? defaultUnitLength(headerMeter),
			heads,
			notes,
			chordSymbols,
			propagation,
			warnings
		}
	};
}

/**
 * The warning for a note whose pitch depends on how far an accidental reaches (abc 2.1 §11.3):
 * the standard's default reads it by letter in every octave; engraved music (and many abc
 * programs) by letter in its own octave. The lick is read the standard's way.
 */
function readingWarning(
	t: Token,
	letter: number,
	octave: number,
	asPitch: number,
	asOctave: number
): MusicWarning {
	const name = (alt: number) => LETTERS[letter] + (alt > 0 ? '♯'.repeat(alt) : '♭'.repeat(-alt));
	const text = t.text.trim();
	const fix = (alt: number) =>
		(['__', '_', '=', '^', '^^'][alt + 2] ?? '') + text.replace(/^[_=^]+/, '');
	return {
		code: 'accidental-reading',
		message:
			`Line ${t.line}, column ${t.column}: “${text}” sounds ${name(asPitch)}${octave} if an accidental holds for its letter in every octave of the bar (abc 2.1 §11.3, the standard's default, which is how it is read here) ` +
			`but ${name(asOctave)}${octave} if it holds in its own octave only, as in engraved music. Write ${fix(asPitch)} or ${fix(asOctave)} to say which you mean.`
	};
}

function formatHeadPitch(p: SpelledPitch): string {
	return LETTERS[p.letter] + (p.alt > 0 ? '#'.repeat(p.alt) : 'b'.repeat(-p.alt)) + p.octave;
}
