/**
 * Spelled pitches as small integers: a letter index (C=0 … B=6), an alteration in semitones and a
 * scientific octave (C4 = middle C = MIDI 60). The hot path of transposition works on these
 * numbers only; tonal is the reference in tests and builds nothing here at run time.
 */
import type { NoteName, PitchName } from './types';

/** Letter names in scale order; a letter index points into this string. */
export const LETTERS = 'CDEFGAB';

/** Semitones of each natural letter above C (C D E F G A B). */
export const LETTER_SEMITONES: readonly number[] = [0, 2, 4, 5, 7, 9, 11];

/** A pitch class spelled by letter and alteration: F# is { letter: 3, alt: 1 }. */
export interface SpelledNote {
	/** 0..6 for C..B. */
	letter: number;
	/** Semitones: -2 double flat … +2 double sharp (larger values allowed in arithmetic). */
	alt: number;
}

/** A spelled pitch with its scientific octave (the octave of the letter: B#3 sounds as C4). */
export interface SpelledPitch extends SpelledNote {
	octave: number;
}

/** A diatonic interval as letter steps and semitones: a major second up is { steps: 1, semitones: 2 }. */
export interface Steps {
	steps: number;
	semitones: number;
}

/** Error for a broken invariant: a value that the engine itself should never produce. */
export class MusicInvariantError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'MusicInvariantError';
	}
}

const mod = (n: number, m: number): number => ((n % m) + m) % m;

/**
 * Pitch class of a semitone count: the one home of this arithmetic for the engine.
 * @example mod12(-1) // 11
 */
export const mod12 = (n: number): number => ((n % 12) + 12) % 12;

/**
 * MIDI number of a spelled pitch.
 * @example midiOf({ letter: 0, alt: 0, octave: 4 }) // 60
 */
export function midiOf(p: SpelledPitch): number {
	return 12 * (p.octave + 1) + LETTER_SEMITONES[p.letter] + p.alt;
}

/**
 * Pitch class (0..11) of a spelled note.
 * @example chromaOf({ letter: 6, alt: -1 }) // 10
 */
export function chromaOf(n: SpelledNote): number {
	return mod(LETTER_SEMITONES[n.letter] + n.alt, 12);
}

/**
 * Accidental text in tonal style.
 * @example accidentalName(-2) // 'bb'
 */
export function accidentalName(alt: number): string {
	return alt > 0 ? '#'.repeat(alt) : 'b'.repeat(-alt);
}

/**
 * Tonal-style name of a pitch class.
 * @example formatNoteName({ letter: 3, alt: 1 }) // 'F#'
 */
export function formatNoteName(n: SpelledNote): NoteName {
	if (n.alt >= -2 && n.alt <= 2) return NOTE_NAMES[n.letter * 5 + n.alt + 2];
	return LETTERS[n.letter] + accidentalName(n.alt);
}

/** Names of every letter with -2..+2 alterations, built once (index letter * 5 + alt + 2). */
const NOTE_NAMES: readonly string[] = Array.from(
	{ length: 35 },
	(_, i) => LETTERS[Math.floor(i / 5)] + accidentalName((i % 5) - 2)
);

/**
 * Scientific pitch name.
 * @example formatPitch({ letter: 6, alt: -1, octave: 3 }) // 'Bb3'
 */
export function formatPitch(p: SpelledPitch): PitchName {
	if (p.alt >= -2 && p.alt <= 2 && p.octave >= -1 && p.octave <= 9) {
		return PITCH_NAMES[(p.letter * 5 + p.alt + 2) * 11 + p.octave + 1];
	}
	return formatNoteName(p) + String(p.octave);
}

/** Pitch names for octaves -1..9 (index (letter * 5 + alt + 2) * 11 + octave + 1), built once. */
const PITCH_NAMES: readonly string[] = Array.from(
	{ length: 35 * 11 },
	(_, i) => NOTE_NAMES[Math.floor(i / 11)] + String((i % 11) - 1)
);

const LETTER_INDEX: Record<string, number> = { C: 0, D: 1, E: 2, F: 3, G: 4, A: 5, B: 6 };

/** Alteration of an accidental suffix, or NaN when it is not one (`#`, `##`, `x`, `b`, `bb`, ♯ ♭ 𝄪 𝄫). */
function altOf(text: string): number {
	switch (text) {
		case '':
			return 0;
		case '#':
		case '♯':
			return 1;
		case '##':
		case 'x':
		case '𝄪':
			return 2;
		case 'b':
		case '♭':
			return -1;
		case 'bb':
		case '𝄫':
			return -2;
		default:
			return NaN;
	}
}

/**
 * Read a pitch-class name (`F#`, `Bb`, `E♭`, `Fx`); null when it is not one. Hand-written rather
 * than a regular expression: re-mapping reads every note name it gets back.
 * @example parseNoteName('Eb') // { letter: 2, alt: -1 }
 */
export function parseNoteName(name: string): SpelledNote | null {
	const text =
		name.length > 0 && (name[0] === ' ' || name[name.length - 1] === ' ') ? name.trim() : name;
	if (text.length === 0) return null;
	const letter = LETTER_INDEX[text[0].toUpperCase()];
	if (letter === undefined) return null;
	const alt = altOf(text.slice(1));
	return Number.isNaN(alt) ? null : { letter, alt };
}

/**
 * Read a scientific pitch name (`F#4`, `Bb-1`); null when it is not one.
 * @example parsePitchName('C#5') // { letter: 0, alt: 1, octave: 5 }
 */
export function parsePitchName(name: string): SpelledPitch | null {
	const text = name.trim();
	let end = text.length;
	while (end > 0 && text.charCodeAt(end - 1) >= 48 && text.charCodeAt(end - 1) <= 57) end--;
	if (end === text.length) return null;
	const digitsFrom = end;
	if (end > 0 && text[end - 1] === '-') end--;
	if (end === 0) return null;
	const n = parseNoteName(text.slice(0, end));
	if (!n) return null;
	const octave = Number(text.slice(digitsFrom));
	return { letter: n.letter, alt: n.alt, octave: end < digitsFrom ? -octave : octave };
}

/**
 * abc accidental for an alteration, with `=` for a natural (abc 2.1 §4.2).
 * @example abcAccidental(-1) // '_'
 */
export function abcAccidental(alt: number): string {
	if (alt === 0) return '=';
	if (Math.abs(alt) > 2) throw new MusicInvariantError(`No abc accidental for alteration ${alt}`);
	return alt > 0 ? '^'.repeat(alt) : '_'.repeat(-alt);
}

/**
 * abc letter with octave marks for a pitch, without accidental (abc 2.1 §4.1: `C` is C4, `c` C5,
 * `'` raises and `,` lowers an octave).
 * @example abcLetter({ letter: 6, alt: -1, octave: 2 }) // 'B,,'
 */
export function abcLetter(p: SpelledPitch): string {
	if (p.octave >= 0 && p.octave < 10) return ABC_LETTERS[p.letter * 10 + p.octave];
	return abcLetterOf(p.letter, p.octave);
}

function abcLetterOf(letter: number, octave: number): string {
	const name = LETTERS[letter];
	if (octave >= 5) return name.toLowerCase() + "'".repeat(octave - 5);
	return name + ','.repeat(4 - octave);
}

/** abc letters with octave marks for octaves 0..9, built once (index letter * 10 + octave). */
const ABC_LETTERS: readonly string[] = Array.from({ length: 70 }, (_, i) =>
	abcLetterOf(Math.floor(i / 10), i % 10)
);

/**
 * Transpose a spelled pitch by letter steps and semitones; the letter moves by `steps` and the
 * alteration absorbs whatever the semitones need.
 * @example transposePitch({ letter: 6, alt: -1, octave: 4 }, { steps: 1, semitones: 2 }) // C5
 */
export function transposePitch(p: SpelledPitch, by: Steps): SpelledPitch {
	const absolute = p.octave * 7 + p.letter + by.steps;
	const letter = mod(absolute, 7);
	const octave = Math.floor(absolute / 7);
	const natural = 12 * (octave + 1) + LETTER_SEMITONES[letter];
	return { letter, alt: midiOf(p) + by.semitones - natural, octave };
}

/**
 * The upward interval (within an octave) from one pitch class to another, by letters.
 * @example stepsBetween({ letter: 0, alt: 0 }, { letter: 4, alt: -1 }) // { steps: 4, semitones: 6 }
 */
export function stepsBetween(from: SpelledNote, to: SpelledNote): Steps {
	const steps = mod(to.letter - from.letter, 7);
	let semitones = LETTER_SEMITONES[to.letter] + to.alt - (LETTER_SEMITONES[from.letter] + from.alt);
	// Bring the semitone count next to the letter distance: C to B# is a seventh of 12, not 0.
	const natural =
		LETTER_SEMITONES[mod(from.letter + steps, 7)] + (from.letter + steps >= 7 ? 12 : 0);
	const base = natural - LETTER_SEMITONES[from.letter];
	while (semitones - base > 6) semitones -= 12;
	while (semitones - base < -6) semitones += 12;
	return { steps, semitones };
}

/**
 * Tonal-style interval name for a step interval (`2M`, `-4P`, `5d`), for messages and tests.
 * @example intervalName({ steps: 4, semitones: 6 }) // '5d'
 */
export function intervalName(iv: Steps): string {
	const sign = iv.steps < 0 || (iv.steps === 0 && iv.semitones < 0) ? -1 : 1;
	const steps = Math.abs(iv.steps);
	const semis = sign * iv.semitones;
	const simple = steps % 7;
	const octaves = Math.floor(steps / 7);
	const base = LETTER_SEMITONES[simple] + 12 * octaves;
	const perfect = simple === 0 || simple === 3 || simple === 4;
	const diff = semis - base;
	let q: string;
	if (perfect) q = diff === 0 ? 'P' : diff > 0 ? 'A'.repeat(diff) : 'd'.repeat(-diff);
	else if (diff === 0) q = 'M';
	else if (diff === -1) q = 'm';
	else q = diff > 0 ? 'A'.repeat(diff) : 'd'.repeat(-diff - 1);
	return (sign < 0 ? '-' : '') + (steps + 1) + q;
}
