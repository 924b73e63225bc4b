/**
 * Key signatures for abc `K:` fields (abc 2.1 §3.1.14): a tonic with a mode, explicit
 * accidentals, and whatever clef parameters follow (kept as text so they re-emit unchanged).
 */
import {
	FLAT_ORDER,
	LETTER_FIFTHS,
	MAJOR_KEY_SPELLINGS,
	MINOR_KEY_SPELLINGS,
	MODE_FIFTHS,
	MODE_PREFIXES,
	SHARP_ORDER,
	type Mode
} from './key-data';
import { chromaOf, formatNoteName, LETTERS, mod12, parseNoteName, type SpelledNote } from './pitch';
import type { KeyName } from './types';

export type { Mode } from './key-data';

/** Which spelling the key a tritone away from C takes. */
export type TritoneSpelling = 'Gb' | 'F#';

/** A key as the engine uses it. */
export interface KeySignature {
	tonic: SpelledNote;
	mode: Mode;
	/** Sharps (positive) or flats (negative) of the mode's signature before explicit accidentals. */
	fifths: number;
	/** Alteration of each letter C..B after explicit accidentals: what an unmarked note sounds. */
	accidentals: number[];
	/** Accidentals written after the tonic and mode (`K:D Phr ^f`), letter and alteration. */
	explicit: SpelledNote[];
	/** `K:none` (or `K:HP`): no signature, no tonic. Transposes as if in C. */
	none: boolean;
	/** Clef and other parameters after the key, as written (`clef=bass middle=d`). */
	rest: string;
}

export type KeyParseResult =
	{ ok: true; key: KeySignature } | { ok: false; message: string; offset: number };

/**
 * Position of a spelled tonic on the circle of fifths (C 0, G 1, F -1, F# 6, Cb -7).
 * @example fifthsOf({ letter: 3, alt: 1 }) // 6
 */
export function fifthsOf(n: SpelledNote): number {
	return LETTER_FIFTHS[n.letter] + 7 * n.alt;
}

/**
 * Letter alterations for a signature of `fifths` sharps (positive) or flats (negative).
 * @example signatureAccidentals(2) // [1, 0, 0, 1, 0, 0, 0] (F# C#)
 */
export function signatureAccidentals(fifths: number): number[] {
	const alts = [0, 0, 0, 0, 0, 0, 0];
	const order = fifths >= 0 ? SHARP_ORDER : FLAT_ORDER;
	const sign = fifths >= 0 ? 1 : -1;
	// Beyond seven the cycle starts again with doubles (G# major has F##).
	for (let i = 0; i < Math.abs(fifths); i++) alts[order[i % 7]] += sign;
	return alts;
}

/**
 * The key signature of a tonic in a mode, without explicit accidentals.
 * @example keyOf('Bb', 'mixolydian').fifths // -3
 */
export function keyOf(tonic: KeyName | SpelledNote, mode: Mode = 'major'): KeySignature {
	const t = typeof tonic === 'string' ? parseNoteName(tonic) : tonic;
	if (!t) throw new RangeError(`Not a key tonic: ${String(tonic)}`);
	const fifths = fifthsOf(t) + MODE_FIFTHS[mode];
	return {
		tonic: t,
		mode,
		fifths,
		accidentals: signatureAccidentals(fifths),
		explicit: [],
		none: false,
		rest: ''
	};
}

const KEY_HEAD = /^([A-G])([#b]?)/;
const EXPLICIT = /^(\^\^|\^|__|_|=)([a-gA-G])$/;

/**
 * Read the value of a `K:` field (abc 2.1 §3.1.14): `G`, `Dm`, `Ador`, `F# mix`, `D Phr ^f`,
 * `none`, `C clef=bass`. Mode names count by their first three letters, any case.
 * @example parseKeyField('Dmix') // { ok: true, key: { fifths: 1, accidentals: [0, 0, 0, 1, 0, 0, 0], … } }
 */
export function parseKeyField(value: string): KeyParseResult {
	const lead = value.length - value.trimStart().length;
	const text = value.trim();
	// §3.1.14: an empty K: is C major; `none` (and the bagpipe keys HP/Hp) mean no signature.
	const noneMatch = /^(none|HP|Hp)(?=\s|$)/.exec(text);
	let tonic: SpelledNote = { letter: 0, alt: 0 };
	let mode: Mode = 'major';
	let none = false;
	let pos = 0;
	if (noneMatch) {
		none = true;
		pos = noneMatch[0].length;
	} else if (text !== '' && !/^(clef=|[\^_=])/.test(text)) {
		const head = KEY_HEAD.exec(text);
		if (!head) {
			const word = text.split(/\s/)[0];
			return {
				ok: false,
				message: `“${word}” is not a key: write a tonic A to G, optionally with # or b, and a mode such as m, mix or dor (for example K:Bb or K:Dm).`,
				offset: lead
			};
		}
		tonic = {
			letter: LETTERS.indexOf(head[1]),
			alt: head[2] === '#' ? 1 : head[2] === 'b' ? -1 : 0
		};
		pos = head[0].length;
		const modeMatch = /^\s*([A-Za-z]+)/.exec(text.slice(pos));
		if (modeMatch && !/^clef$/i.test(modeMatch[1]) && !isClefWord(modeMatch[1])) {
			const word = modeMatch[1];
			const lower = word.toLowerCase();
			const found = lower === 'm' ? 'minor' : MODE_PREFIXES[lower.slice(0, 3)];
			const isExp = lower.startsWith('exp');
			if (!found && !isExp) {
				return {
					ok: false,
					message: `“${text.slice(0, pos)}${word}” is not a key: the mode “${word}” is unknown (use major, m, mix, dor, phr, lyd, loc, ion or aeo).`,
					offset: lead + pos + modeMatch[0].indexOf(word)
				};
			}
			// A mode name must be a known word, not merely start like one ("mixer" is not a mode).
			if (found && lower.length > 3 && !FULL_MODE_WORDS.some((w) => w.startsWith(lower))) {
				return {
					ok: false,
					message: `“${word}” is not a mode name (use major, m, mix, dor, phr, lyd, loc, ion or aeo).`,
					offset: lead + pos + modeMatch[0].indexOf(word)
				};
			}
			if (found) mode = found;
			pos += modeMatch[0].length;
		}
	}
	const explicit: SpelledNote[] = [];
	const restParts: string[] = [];
	const restText = text.slice(pos);
	const words = restText.split(/(\s+)/);
	let cursor = pos;
	for (const w of words) {
		const m = EXPLICIT.exec(w);
		if (m && restParts.join('').trim() === '') {
			const alt = { '^^': 2, '^': 1, '=': 0, _: -1, __: -2 }[m[1]] ?? 0;
			explicit.push({ letter: LETTERS.indexOf(m[2].toUpperCase()), alt });
		} else if (/^[\^_=]/.test(w) && restParts.join('').trim() === '') {
			return {
				ok: false,
				message: `“${w}” is not a key accidental: write ^, _ or = and a letter, for example ^f.`,
				offset: lead + cursor
			};
		} else if (w.trim() !== '' && !isClefParameter(w)) {
			return {
				ok: false,
				message: `“${text}” is not a key: “${w}” is neither an accidental such as ^f nor a clef setting such as clef=bass.`,
				offset: lead + cursor
			};
		} else if (w.trim() !== '' || restParts.length > 0) restParts.push(w);
		cursor += w.length;
	}
	const fifths = none ? 0 : fifthsOf(tonic) + MODE_FIFTHS[mode];
	const accidentals = none ? [0, 0, 0, 0, 0, 0, 0] : signatureAccidentals(fifths);
	for (const e of explicit) accidentals[e.letter] = e.alt;
	return {
		ok: true,
		key: { tonic, mode, fifths, accidentals, explicit, none, rest: restParts.join('').trim() }
	};
}

const FULL_MODE_WORDS = [
	'major',
	'minor',
	'ionian',
	'aeolian',
	'mixolydian',
	'dorian',
	'phrygian',
	'lydian',
	'locrian'
];
const CLEF_WORDS = ['treble', 'bass', 'alto', 'tenor', 'perc', 'none', 'baritone', 'soprano'];
function isClefParameter(word: string): boolean {
	return (
		/^[A-Za-z-]+=\S*$/.test(word) || /^[+-]8$/.test(word) || isClefWord(word.replace(/[+-]8$/, ''))
	);
}
function isClefWord(word: string): boolean {
	return (
		CLEF_WORDS.includes(word.toLowerCase()) || /^(middle|transpose|octave|stafflines)$/i.test(word)
	);
}

/**
 * Short abc mode suffix for writing a K: field.
 * @example modeSuffix('dorian') // 'dor'
 */
export function modeSuffix(mode: Mode): string {
	return {
		major: '',
		minor: 'm',
		mixolydian: 'mix',
		dorian: 'dor',
		phrygian: 'phr',
		lydian: 'lyd',
		locrian: 'loc'
	}[mode];
}

/**
 * Write a key back as the value of a K: field (explicit accidentals and clef text kept).
 * @example formatKeyField(keyOf('Eb', 'minor')) // 'Ebm'
 */
export function formatKeyField(key: KeySignature): string {
	let text = keyTexts.get(key);
	if (text === undefined) {
		text = writeKeyField(key);
		keyTexts.set(key, text);
	}
	return text;
}

/** K: values already written, per key object (key objects are never changed once made). */
const keyTexts = new WeakMap<KeySignature, string>();

function writeKeyField(key: KeySignature): string {
	const parts = [key.none ? 'none' : formatNoteName(key.tonic) + modeSuffix(key.mode)];
	for (const e of key.explicit) {
		const acc = e.alt === 0 ? '=' : e.alt > 0 ? '^'.repeat(e.alt) : '_'.repeat(-e.alt);
		parts.push(acc + LETTERS[e.letter].toLowerCase());
	}
	if (key.rest) parts.push(key.rest);
	return parts.join(' ');
}

/**
 * All spellings of a pitch class as a tonic with at most one sharp or flat.
 * @example tonicSpellings(6) // F#, Gb
 */
function tonicSpellings(pc: number): SpelledNote[] {
	const out: SpelledNote[] = [];
	for (let letter = 0; letter < 7; letter++) {
		for (const alt of [-1, 0, 1]) if (chromaOf({ letter, alt }) === pc) out.push({ letter, alt });
	}
	return out;
}

/**
 * The usual jazz spelling of the tonic of a key on pitch class `pc` (C=0) in `mode`: the major
 * and minor tables (common practice), and for the other modes the spelling with the fewest
 * accidentals, a tie going the way of the tritone setting.
 * @example jazzTonic(6, 'major', 'F#') // { letter: 3, alt: 1 }
 */
export function jazzTonic(pc: number, mode: Mode, tritone: TritoneSpelling = 'Gb'): SpelledNote {
	const p = mod12(pc);
	if (mode === 'major') {
		return parseNoteName(p === 6 ? tritone : MAJOR_KEY_SPELLINGS[p]) as SpelledNote;
	}
	if (mode === 'minor') return parseNoteName(MINOR_KEY_SPELLINGS[p]) as SpelledNote;
	const candidates = tonicSpellings(p).map((t) => ({ t, f: fifthsOf(t) + MODE_FIFTHS[mode] }));
	candidates.sort(
		(a, b) => Math.abs(a.f) - Math.abs(b.f) || (tritone === 'F#' ? b.f - a.f : a.f - b.f)
	);
	return candidates[0].t;
}

/**
 * The twelve keys of a drill in the usual jazz spelling, C upwards by half steps, the tritone
 * key by setting (common practice; REFERENCES.md §2).
 * @example twelveKeys('major', 'F#') // ['C', 'Db', 'D', 'Eb', 'E', 'F', 'F#', 'G', 'Ab', 'A', 'Bb', 'B']
 */
export function twelveKeys(mode: Mode = 'major', tritone: TritoneSpelling = 'Gb'): KeyName[] {
	return Array.from({ length: 12 }, (_, pc) => formatNoteName(jazzTonic(pc, mode, tritone)));
}
