/**
 * Instruments a learner reads for: written transposition, clef and practical written range.
 *
 * `written` is the interval from concert pitch up to the written note (concert C4 on a B-flat
 * tenor saxophone is written D5: a major ninth, '9M'). Transpositions: any orchestration text;
 * checked against MusicXML 4.0 `<transpose>` values (REFERENCES.md §4). Ranges are practical
 * written ranges for single lines, from memory: S. Adler, The Study of Orchestration, 3rd ed.
 * (2002); D. Lowell & K. Pullig, Arranging for Large Jazz Ensemble (2003). They are settings,
 * not laws: strong players go further. The concert rows are reading ranges (common practice:
 * within two ledger lines of the staff).
 */

export const INSTRUMENT_IDS = [
	'concert',
	'concert-bass',
	'trumpet',
	'clarinet',
	'soprano-sax',
	'alto-sax',
	'tenor-sax',
	'baritone-sax',
	'guitar',
	'bass',
	'trombone',
	'flute',
	'piano',
	'vibraphone'
] as const;
export type InstrumentId = (typeof INSTRUMENT_IDS)[number];

/** abc clef names (abc 2.1 §4.6); `treble-8` reads an octave below the written note. */
export type ClefName = 'treble' | 'bass' | 'treble-8';

export interface InstrumentRow {
	id: InstrumentId;
	label: string;
	/** Interval from concert up to written, tonal style ('1P' for concert-pitch instruments). */
	written: string;
	clef: ClefName;
	/** Practical written range, MIDI numbers of the written notes. */
	low: number;
	high: number;
	/** abcjs tablature instrument, when the instrument reads tablature. */
	tablature: 'guitar' | null;
}

export const INSTRUMENT_ROWS: readonly InstrumentRow[] = [
	// Reading ranges: A3–C6 in treble clef, C2–E4 in bass clef (two ledger lines; common practice).
	{
		id: 'concert',
		label: 'Concert pitch (treble clef)',
		written: '1P',
		clef: 'treble',
		low: 57,
		high: 84,
		tablature: null
	},
	{
		id: 'concert-bass',
		label: 'Concert pitch (bass clef)',
		written: '1P',
		clef: 'bass',
		low: 36,
		high: 64,
		tablature: null
	},
	// Adler: B-flat trumpet written F#3–C6 for jazz lines (Lowell & Pullig give the same).
	{
		id: 'trumpet',
		label: 'B-flat trumpet',
		written: '2M',
		clef: 'treble',
		low: 54,
		high: 84,
		tablature: null
	},
	// Adler: B-flat clarinet written E3–G6 (the practical top; C7 exists).
	{
		id: 'clarinet',
		label: 'B-flat clarinet',
		written: '2M',
		clef: 'treble',
		low: 52,
		high: 91,
		tablature: null
	},
	// Lowell & Pullig: every saxophone reads B-flat3–F6 written, without altissimo.
	{
		id: 'soprano-sax',
		label: 'B-flat soprano saxophone',
		written: '2M',
		clef: 'treble',
		low: 58,
		high: 89,
		tablature: null
	},
	{
		id: 'alto-sax',
		label: 'E-flat alto saxophone',
		written: '6M',
		clef: 'treble',
		low: 58,
		high: 89,
		tablature: null
	},
	{
		id: 'tenor-sax',
		label: 'B-flat tenor saxophone',
		written: '9M',
		clef: 'treble',
		low: 58,
		high: 89,
		tablature: null
	},
	{
		id: 'baritone-sax',
		label: 'E-flat baritone saxophone',
		written: '13M',
		clef: 'treble',
		low: 58,
		high: 89,
		tablature: null
	},
	// Adler: guitar written an octave above sounding, E3–E6 for single lines (22 frets reach D7).
	{
		id: 'guitar',
		label: 'Guitar (with tablature)',
		written: '8P',
		clef: 'treble-8',
		low: 52,
		high: 88,
		tablature: 'guitar'
	},
	// Adler: double bass and bass guitar written an octave above sounding, E2–G4 written.
	{ id: 'bass', label: 'Bass', written: '8P', clef: 'bass', low: 40, high: 67, tablature: null },
	// Lowell & Pullig: tenor trombone E2–B-flat4 (F5 for strong players), concert pitch.
	{
		id: 'trombone',
		label: 'Trombone',
		written: '1P',
		clef: 'bass',
		low: 40,
		high: 70,
		tablature: null
	},
	// Adler: flute C4–C7.
	{
		id: 'flute',
		label: 'Flute',
		written: '1P',
		clef: 'treble',
		low: 60,
		high: 96,
		tablature: null
	},
	// Right-hand lines sit mostly C4–C6 (common practice; the keyboard itself is A0–C8).
	{
		id: 'piano',
		label: 'Piano (right hand)',
		written: '1P',
		clef: 'treble',
		low: 60,
		high: 84,
		tablature: null
	},
	// Adler: vibraphone F3–F6, sounding as written.
	{
		id: 'vibraphone',
		label: 'Vibraphone',
		written: '1P',
		clef: 'treble',
		low: 53,
		high: 89,
		tablature: null
	}
];
