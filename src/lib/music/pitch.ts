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
	return LETTERS[n.letter] + accidentalName(n.alt);
}

/**
 * Scientific pitch name.
 * @example formatPitch({ letter: 6, alt: -1, octave: 3 }) // 'Bb3'
 */
export function formatPitch(p: SpelledPitch): PitchName {
	return formatNoteName(p) + p.octave;
}

const NOTE_NAME = /^([A-Ga-g])(#{1,2}|b{1,2}|x|♯|♭|𝄪|𝄫)?$/u;
const ALT_OF: Record<string, number> = {
	'': 0,
	'#': 1,
	'##': 2,
	x: 2,
	'♯': 1,
	'𝄪': 2,
	b: -1,
	bb: -2,
	'♭': -1,
	'𝄫': -2
};

/**
 * Read a pitch-class name (`F#`, `Bb`, `E♭`, `Fx`); null when it is not one.
 * @example parseNoteName('Eb') // { letter: 2, alt: -1 }
 */
export function parseNoteName(name: string): SpelledNote | null {
	const m = NOTE_NAME.exec(name.trim());
	if (!m) return null;
	return { letter: LETTERS.indexOf(m[1].toUpperCase()), alt: ALT_OF[m[2] ?? ''] };
}

/**
 * Read a scientific pitch name (`F#4`, `Bb-1`); null when it is not one.
 * @example parsePitchName('C#5') // { letter: 0, alt: 1, octave: 5 }
 */
export function parsePitchName(name: string): SpelledPitch | null {
	const m = /^(.+?)(-?\d+)$/.exec(name.trim());
	if (!m) return null;
	const n = parseNoteName(m[1]);
	return n && { ...n, octave: Number(m[2]) };
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
	const name = LETTERS[p.letter];
	if (p.octave >= 5) return name.toLowerCase() + "'".repeat(p.octave - 5);
	return name + ','.repeat(4 - p.octave);
}

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
	const natural = LETTER_SEMITONES[mod(from.letter + steps, 7)] + (from.letter + steps >= 7 ? 12 : 0);
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
