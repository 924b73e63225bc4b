/**
 * Key tables. Sources:
 * - circle of fifths: sharps F C G D A E B, flats B E A D G C F; major keys C 0, G +1 … C# +7,
 *   F -1 … Cb -7 (abc 2.1 §3.1.14 key table; checked in tests against tonal 6.5.1
 *   `Key.majorKey(k).alteration` and `Key.minorKey(k).alteration`);
 * - modes as offsets on the circle of fifths from the major key on the same tonic (abc 2.1
 *   §3.1.14 mode table: Dmix and Ador both have one sharp);
 * - jazz key spellings (common practice, horn players lean flat; REFERENCES.md §2).
 */
import type { KeyName } from './types';

export const MODES = [
	'major',
	'minor',
	'mixolydian',
	'dorian',
	'phrygian',
	'lydian',
	'locrian'
] as const;
export type Mode = (typeof MODES)[number];

/** Fifths to add to the major key on the same tonic (abc 2.1 §3.1.14). */
export const MODE_FIFTHS: Record<Mode, number> = {
	lydian: 1,
	major: 0,
	mixolydian: -1,
	dorian: -2,
	minor: -3,
	phrygian: -4,
	locrian: -5
};

/** Mode names by their first three letters, case-insensitive (abc 2.1 §3.1.14). */
export const MODE_PREFIXES: Record<string, Mode> = {
	maj: 'major',
	ion: 'major',
	min: 'minor',
	aeo: 'minor',
	m: 'minor',
	mix: 'mixolydian',
	dor: 'dorian',
	phr: 'phrygian',
	lyd: 'lydian',
	loc: 'locrian'
};

/** Letter indices (C=0) in the order sharps are added to a key signature. */
export const SHARP_ORDER: readonly number[] = [3, 0, 4, 1, 5, 2, 6];
/** Letter indices in the order flats are added. */
export const FLAT_ORDER: readonly number[] = [6, 2, 5, 1, 4, 0, 3];

/** Position on the circle of fifths of each natural letter, C = 0 (F -1 … B +5). */
export const LETTER_FIFTHS: readonly number[] = [0, 2, 4, -1, 1, 3, 5];

/** Major keys by pitch class (C=0) with the usual jazz spelling; index 6 depends on the tritone setting. */
export const MAJOR_KEY_SPELLINGS: readonly KeyName[] = [
	'C',
	'Db',
	'D',
	'Eb',
	'E',
	'F',
	'Gb',
	'G',
	'Ab',
	'A',
	'Bb',
	'B'
];

/** Minor keys by pitch class (C=0) with the usual jazz spelling. */
export const MINOR_KEY_SPELLINGS: readonly KeyName[] = [
	'C',
	'C#',
	'D',
	'Eb',
	'E',
	'F',
	'F#',
	'G',
	'G#',
	'A',
	'Bb',
	'B'
];

/** The key a twelve-key drill walks through (cycle of fourths, common practice). */
export const CYCLE_OF_FOURTHS: readonly KeyName[] = [
	'C',
	'F',
	'Bb',
	'Eb',
	'Ab',
	'Db',
	'Gb',
	'B',
	'E',
	'A',
	'D',
	'G'
];
