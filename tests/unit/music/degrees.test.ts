import { describe, expect, it } from 'vitest';
import { Interval, Note } from 'tonal';
import { chromaOfName, degreeAt, degreeOf, readNote } from '../../../src/lib/music/degrees';
import { QUALITY_IDS } from '../../../src/lib/music/types';
import { chordOf } from './line-helper';

const label = (pitch: string, symbol: string) => degreeOf(pitch, chordOf(symbol)).label;
const role = (pitch: string, symbol: string) => degreeOf(pitch, chordOf(symbol)).role;

describe('degreeOf', () => {
	// REFERENCES.md §3 worked examples (common practice; semitones checked with tonal Interval.distance).
	it.each([
		['F4', 'b9', 'tension'],
		['G4', '#9', 'tension'],
		['A4', '11', 'avoid'],
		['C5', 'b13', 'tension'],
		['C#5', '13', 'tension'],
		['E4', 'R', 'chord-tone'],
		['G#4', '3', 'chord-tone'],
		['D5', 'b7', 'chord-tone'],
		['D#5', '7', 'chromatic']
	])('labels %s over E7 as the %s (%s)', (pitch, expected, expectedRole) => {
		expect(label(pitch, 'E7')).toBe(expected);
		expect(role(pitch, 'E7')).toBe(expectedRole);
	});

	// Common practice: the suspended fourth is named as the symbol names it, “sus4”, the 4; the
	// same pitch class is the 11 over an eleventh chord, which stacks it above the 9 (tonal 6.5.1
	// `Chord.get('C11').intervals` = 1P 5P 7m 9M 11P).
	it('calls A the chord tone 4 on E7sus4, where it is an avoid 11 on E7', () => {
		expect(degreeOf('A4', chordOf('E7sus4'))).toMatchObject({ label: '4', role: 'chord-tone' });
		expect(degreeOf('G#4', chordOf('E7sus4'))).toMatchObject({ label: '3', role: 'avoid' });
		expect(degreeOf('A4', chordOf('E7'))).toMatchObject({ label: '11', role: 'avoid' });
	});

	it.each(['C', 'Db', 'D', 'Eb', 'E', 'F', 'F#', 'G', 'Ab', 'A', 'Bb', 'B'])(
		'names the fourth over 7sus4, sus4 and 9sus4 on %s the 4, and over the 11 chord the 11',
		(root) => {
			const fourth = Note.transpose(root, '4P');
			for (const suffix of ['7sus4', 'sus4', '9sus4'])
				expect(degreeOf(`${fourth}4`, chordOf(root + suffix)).label).toBe('4');
			expect(degreeOf(`${fourth}4`, chordOf(root + '11')).label).toBe('11');
		}
	);

	it('labels the D7 chromatic fill F# F E Eb D as 3 #9 9 b9 R', () => {
		expect(['F#4', 'F4', 'E4', 'Eb4', 'D4'].map((p) => label(p, 'D7'))).toEqual([
			'3',
			'#9',
			'9',
			'b9',
			'R'
		]);
	});

	it('labels the Dm7 fill A Ab G Gb F as 5 b5 11 (chromatic) b3', () => {
		const line = ['A4', 'Ab4', 'G4', 'Gb4', 'F4'];
		expect(line.map((p) => label(p, 'Dm7'))).toEqual(['5', 'b5', '11', '3', 'b3']);
		expect(line.map((p) => role(p, 'Dm7'))).toEqual([
			'chord-tone',
			'chromatic',
			'tension',
			'chromatic',
			'chord-tone'
		]);
	});

	it('labels the G7 upper structure F A C E as b7 9 11 13', () => {
		expect(['F5', 'A5', 'C6', 'E6'].map((p) => label(p, 'G7'))).toEqual(['b7', '9', '11', '13']);
	});

	it.each([
		['Eb4', 'Cm7', 'b3'],
		['Eb4', 'C7', '#9'],
		['Gb4', 'Cm7b5', 'b5'],
		['F#4', 'C7', '#11'],
		['A4', 'Cdim7', 'bb7'],
		['Bbb4', 'Cdim7', 'bb7'],
		['A4', 'C6', '6'],
		['A4', 'Cm6', '6'],
		['A4', 'C7', '13'],
		['B4', 'Cmaj7', '7'],
		['D#4', 'C7alt', '#9'],
		['Ab4', 'C7alt', 'b13'],
		['G4', 'C7alt', '5'],
		['Cb5', 'Cmaj7', '7'],
		['E#4', 'C#7', '3'],
		['D', 'Bb7#11/D', '3']
	])('labels %s over %s as %s, by semitones rather than letters', (pitch, symbol, expected) => {
		expect(label(pitch, symbol)).toBe(expected);
	});

	it('counts semitones exactly as tonal 6.5.1 Interval.distance does, for every root and pitch', () => {
		const roots = [
			'C',
			'C#',
			'Db',
			'D',
			'Eb',
			'E',
			'F',
			'F#',
			'Gb',
			'G',
			'Ab',
			'A',
			'Bb',
			'B',
			'Cb',
			'E#'
		];
		const pitches = [
			'C4',
			'Db4',
			'D4',
			'D#4',
			'E4',
			'F4',
			'Gb4',
			'G4',
			'Ab4',
			'A4',
			'Bb4',
			'B4',
			'Fb4',
			'B#3'
		];
		for (const root of roots)
			for (const pitch of pitches) {
				// reference: tonal 6.5.1 Interval.semitones(Interval.distance(root, pitch class))
				const semis = Interval.semitones(Interval.distance(root, Note.pitchClass(pitch)))!;
				const d = degreeOf(pitch, { symbol: root + '7', root, quality: '7', bass: null });
				expect(d.semitones, `${pitch} over ${root}`).toBe(((semis % 12) + 12) % 12);
			}
	});

	it('names degrees over a quality outside the table from its own tones, the rest as over a dominant', () => {
		// reference: tonal 6.5.1 ChordType.get('+').intervals is 1P 3M 5A: G# is a chord tone of C+
		expect(degreeOf('G#4', chordOf('C+'))).toMatchObject({ label: 'b13', role: 'chord-tone' });
		expect(degreeOf('D4', chordOf('C+'))).toMatchObject({ label: '9', role: 'unknown' });
	});

	it.each([
		// reference: tonal 6.5.1 ChordType.get(<suffix>).intervals (run); the engine's answer over
		// CmMaj7, C7#9, C13 and C7b13 is checked in chord-spelling.test.ts
		['CmMaj7', 'Eb4', 'b3', 'chord-tone'],
		['C7#11', 'F#4', '#11', 'chord-tone'],
		['C9', 'D4', '9', 'chord-tone'],
		['Cmaj7#11', 'F#4', '#11', 'chord-tone'],
		['Cmaj7#11', 'B4', '7', 'chord-tone']
	])(
		'labels over %s the note %s as the %s, a %s, from the symbol’s own tones',
		(symbol, pitch, label, role) => {
			expect(degreeOf(pitch, chordOf(symbol))).toMatchObject({ label, role });
		}
	);

	it('gives every quality twelve distinct labels with a scale-degree number', () => {
		for (const q of QUALITY_IDS) {
			const labels = Array.from({ length: 12 }, (_, s) => degreeAt(s, q));
			expect(new Set(labels.map((d) => d.label)).size, q).toBe(12);
			for (const d of labels) expect(d.number).toBeGreaterThanOrEqual(1);
		}
	});

	it('throws on a pitch that is not a note name, naming it', () => {
		expect(() => degreeOf('H4', chordOf('C7'))).toThrow("'H4'");
		expect(() => degreeOf('C4', { symbol: '?', root: 'X', quality: '7', bass: null })).toThrow(
			"'X'"
		);
	});
});

describe('readNote and chromaOfName', () => {
	it.each([
		['C4', 0],
		['Bb3', 10],
		['B#3', 0],
		['Fb', 4],
		['F##2', 7],
		['Ebb', 2]
	])('gives %s the pitch class %i, as tonal 6.5.1 Note.chroma does', (name, expected) => {
		expect(chromaOfName(name)).toBe(expected);
		// reference: tonal 6.5.1 Note.chroma
		expect(Note.chroma(name)).toBe(expected);
	});

	it('returns the same object for a name read twice', () => {
		expect(readNote('G#5')).toBe(readNote('G#5'));
	});
});
