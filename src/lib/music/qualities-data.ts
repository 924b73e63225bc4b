/**
 * The chord-quality table: chord tones, parent chord scale, available tensions and avoid notes of
 * every quality a lick can be re-mapped over. Intervals are tonal-style names above the root.
 *
 * Sources, row by row:
 * - chord tones: tonal 6.5.1 `Chord.get('C<symbol>').intervals` (run), except `7alt`, where tonal's
 *   chord is 1 3 #5 b7 #9; we keep 1 3 b7 and let the altered scale supply the rest.
 * - parent scales: tonal 6.5.1 `Scale.get('C <scale>')` (run; the tests compare pitch classes).
 *   The whole-half diminished scale is spelled 1 2 b3 4 b5 b6 bb7 7 here, so that its seventh
 *   degree is the chord's bb7 (tonal spells the same notes 6m 6M 7M).
 * - tensions and avoid notes: M. Levine, The Jazz Theory Book (1995), from memory; B. Nettles &
 *   R. Graf, The Chord Scale Theory & Jazz Harmony (1997), from memory.
 */
import type { QualityId } from './types';

/** Degree names a note can get over a chord (semitones above the root decide, not letters). */
export const DEGREE_LABELS = [
	'R',
	'b9',
	'9',
	'#9',
	'b3',
	'3',
	'4',
	'11',
	'#11',
	'b5',
	'5',
	'b13',
	'13',
	'6',
	'bb7',
	'b7',
	'7'
] as const;
export type DegreeLabel = (typeof DEGREE_LABELS)[number];

/** Labels by semitones above the root, as over a dominant chord; rows override a few. */
export const BASE_LABELS: readonly DegreeLabel[] = [
	'R',
	'b9',
	'9',
	'#9',
	'3',
	'11',
	'#11',
	'5',
	'b13',
	'13',
	'b7',
	'7'
];

/** Scale-degree number (1..7) each label belongs to: the number a re-mapping keeps. */
export const LABEL_NUMBER: Readonly<Record<DegreeLabel, number>> = {
	R: 1,
	b9: 2,
	'9': 2,
	'#9': 2,
	b3: 3,
	'3': 3,
	'4': 4,
	'11': 4,
	'#11': 4,
	b5: 5,
	'5': 5,
	b13: 6,
	'13': 6,
	'6': 6,
	bb7: 7,
	b7: 7,
	'7': 7
};

export interface QualityRow {
	id: QualityId;
	/** A name for messages. */
	name: string;
	chordTones: readonly string[];
	scale: {
		/** Name as the teacher reads it. */
		name: string;
		/** The tonal 6.5.1 scale name holding the same pitch classes. */
		tonal: string;
		intervals: readonly string[];
	};
	/** Available tensions (may come from a second usual scale: Lydian #11 on maj7, Locrian ♮2). */
	tensions: readonly string[];
	avoid: readonly string[];
	/** Labels that differ from BASE_LABELS, by semitones. */
	labels?: Readonly<Partial<Record<number, DegreeLabel>>>;
	/** Spelling in a line where it differs from the scale's interval, by semitones. */
	spelling?: Readonly<Partial<Record<number, string>>>;
	/** Candidates for a degree number the scale lacks or holds twice; more than one is ambiguous. */
	choices?: Readonly<Partial<Record<number, readonly string[]>>>;
	/**
	 * A chord tone of this quality standing in for a degree number it lacks, when a line is
	 * re-mapped onto it: the 6 for the 7 of the sixth chords, the 4 for the 3 of a sus chord.
	 */
	standIn?: Readonly<Partial<Record<number, string>>>;
	/** Source labels whose move onto this quality is a judgement call, and why. */
	ambiguous?: Readonly<Partial<Record<DegreeLabel, string>>>;
}

/** Minor-third chords call 3 semitones b3; the blue b5 of the minor chords sits at 6. */
const MINOR_LABELS = { 3: 'b3', 6: 'b5' } as const;

export const QUALITY_ROWS: readonly QualityRow[] = [
	{
		// Levine: Mixolydian; 11 is the avoid note; b9 #9 #11 b13 are available by other scales
		// (half-whole diminished, altered, Lydian dominant).
		id: '7',
		name: 'dominant seventh',
		chordTones: ['1P', '3M', '5P', '7m'],
		scale: {
			name: 'Mixolydian',
			tonal: 'mixolydian',
			intervals: ['1P', '2M', '3M', '4P', '5P', '6M', '7m']
		},
		tensions: ['2M', '6M', '2m', '2A', '4A', '6m'],
		avoid: ['4P'],
		// A #9 in a line reads as the blue minor third (F over D7), as lead sheets write it.
		spelling: { 3: '3m' }
	},
	{
		// Levine, Nettles & Graf: Dorian; 9 11 13 available, no avoid note.
		id: 'm7',
		name: 'minor seventh',
		chordTones: ['1P', '3m', '5P', '7m'],
		scale: {
			name: 'Dorian',
			tonal: 'dorian',
			intervals: ['1P', '2M', '3m', '4P', '5P', '6M', '7m']
		},
		tensions: ['2M', '4P', '6M'],
		avoid: [],
		labels: MINOR_LABELS,
		spelling: { 6: '5d' },
		ambiguous: { '#11': 'it could also stay a half step lower as the b5, a blue note' }
	},
	{
		// Levine: Ionian with 11 avoided, or Lydian with #11; 9 and 13 available. A line re-mapped
		// onto major takes the Lydian fourth: the avoid 11 of the source becomes the #11.
		id: 'maj7',
		name: 'major seventh',
		chordTones: ['1P', '3M', '5P', '7M'],
		scale: {
			name: 'Ionian',
			tonal: 'major',
			intervals: ['1P', '2M', '3M', '4P', '5P', '6M', '7M']
		},
		tensions: ['2M', '6M', '4A'],
		avoid: ['4P'],
		choices: { 4: ['4A'] },
		ambiguous: { '#9': 'it could also be read as a blue note leading to the 3' }
	},
	{
		// Levine: Locrian, b9 avoided; Locrian ♮2 makes the 9 available; 11 and b13 available.
		id: 'm7b5',
		name: 'half-diminished',
		chordTones: ['1P', '3m', '5d', '7m'],
		scale: {
			name: 'Locrian',
			tonal: 'locrian',
			intervals: ['1P', '2m', '3m', '4P', '5d', '6m', '7m']
		},
		tensions: ['4P', '6m', '2M'],
		avoid: ['2m'],
		labels: MINOR_LABELS
	},
	{
		// Levine: the altered scale (seventh mode of melodic minor): b9 #9 #11 b13 over 1 3 b7.
		id: '7alt',
		name: 'altered dominant',
		chordTones: ['1P', '3M', '7m'],
		scale: {
			name: 'altered',
			tonal: 'altered',
			intervals: ['1P', '2m', '2A', '3M', '4A', '6m', '7m']
		},
		tensions: ['2m', '2A', '4A', '6m'],
		avoid: [],
		// Written as the flat-side melodic minor a half step up reads (Db Eb E Gb Ab Bb over C7alt).
		spelling: { 3: '3m', 6: '5d' },
		// The altered scale has two seconds and no fifth: the natural 9 and 5 have two homes.
		choices: { 2: ['2m', '2A'], 5: ['6m', '5d'] }
	},
	{
		// Levine: whole-half diminished; 9 11 b13 and maj7 available.
		id: 'dim7',
		name: 'diminished seventh',
		chordTones: ['1P', '3m', '5d', '7d'],
		scale: {
			name: 'whole-half diminished',
			tonal: 'diminished',
			intervals: ['1P', '2M', '3m', '4P', '5d', '6m', '7d', '7M']
		},
		tensions: ['2M', '4P', '6m', '7M'],
		avoid: [],
		// 9 semitones is the chord's own seventh (bb7); written as a sixth to avoid double flats.
		labels: { ...MINOR_LABELS, 9: 'bb7' },
		spelling: { 9: '6M' }
	},
	{
		// Levine: tonic major sixth, Ionian (Lydian for #11); 6 and maj7 interchange on a tonic chord.
		id: '6',
		name: 'major sixth',
		chordTones: ['1P', '3M', '5P', '6M'],
		scale: {
			name: 'Ionian',
			tonal: 'major',
			intervals: ['1P', '2M', '3M', '4P', '5P', '6M', '7M']
		},
		tensions: ['2M', '4A', '7M'],
		avoid: ['4P'],
		labels: { 9: '6' },
		// A dominant or major-seventh arpeggio over a sixth chord plays the sixth (C E G A).
		standIn: { 7: '6M' },
		ambiguous: { '#9': 'it could also be read as a blue note leading to the 3' }
	},
	{
		// Levine: tonic minor sixth, melodic minor; 9 11 and maj7 available.
		id: 'm6',
		name: 'minor sixth',
		chordTones: ['1P', '3m', '5P', '6M'],
		scale: {
			name: 'melodic minor',
			tonal: 'melodic minor',
			intervals: ['1P', '2M', '3m', '4P', '5P', '6M', '7M']
		},
		tensions: ['2M', '4P', '7M'],
		avoid: [],
		labels: { ...MINOR_LABELS, 9: '6' },
		spelling: { 6: '5d' },
		standIn: { 7: '6M' },
		ambiguous: { '#11': 'it could also stay a half step lower as the b5, a blue note' }
	},
	{
		// Levine: Mixolydian over the sus chord; the 3 is the avoid note, 9 and 13 available.
		id: '7sus4',
		name: 'suspended dominant',
		chordTones: ['1P', '4P', '5P', '7m'],
		scale: {
			name: 'Mixolydian',
			tonal: 'mixolydian',
			intervals: ['1P', '2M', '3M', '4P', '5P', '6M', '7m']
		},
		tensions: ['2M', '6M'],
		avoid: ['3M'],
		// The fourth replaces the third (C F G Bb), and is named as the symbol names it: the 4, not
		// the 11 (common practice: “sus4”).
		labels: { 5: '4' },
		standIn: { 3: '4P' }
	}
];

/** Each quality in a sentence, lower case: “over a half-diminished chord”. */
export const QUALITY_WORDS: Readonly<Record<QualityId, string>> = {
	'7': 'dominant 7th',
	m7: 'minor 7th',
	maj7: 'major 7th',
	m7b5: 'half-diminished',
	'7alt': 'altered',
	dim7: 'diminished 7th',
	'6': 'major 6th',
	m6: 'minor 6th',
	'7sus4': 'suspended'
};

/** Each quality's symbol with real signs, for a table cell. */
export const QUALITY_SYMBOLS: Readonly<Record<QualityId, string>> = {
	'7': '7',
	m7: 'm7',
	maj7: 'maj7',
	m7b5: 'm7♭5',
	'7alt': '7alt',
	dim7: 'dim7',
	'6': '6',
	m6: 'm6',
	'7sus4': '7sus4'
};

/** How a picker names each quality: the word a teacher says, then the symbol. */
export const QUALITY_LABELS: Readonly<Record<QualityId, string>> = {
	'7': 'Dominant (7)',
	m7: 'Minor 7th (m7)',
	maj7: 'Major 7th (maj7)',
	m7b5: 'Half-diminished (m7♭5)',
	'7alt': 'Altered (7alt)',
	dim7: 'Diminished (dim7)',
	'6': 'Major 6th (6)',
	m6: 'Minor 6th (m6)',
	'7sus4': 'Suspended (7sus4)'
};
