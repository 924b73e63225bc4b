import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Chord, Interval, Note } from 'tonal';
import { analyseNotes, intervalWords } from '../../../src/lib/music/analysis';
import { chordOf, lineOver } from './line-helper';

const devicesOf = (chords: Parameters<typeof lineOver>[0], line: string) =>
	analyseNotes(lineOver(chords, line)).devices;
const kinds = (chords: Parameters<typeof lineOver>[0], line: string) =>
	devicesOf(chords, line).map((d) => d.kind);

describe('analyseNotes: arpeggios', () => {
	it('names a maj7 arpeggio from the b7 of G7 and the extensions it gives (REFERENCES.md §3)', () => {
		const [d] = devicesOf('G7', 'F4 A4 C5 E5');
		// reference: tonal 6.5.1 Chord.detect(['F', 'A', 'C', 'E']) is ['Fmaj7']
		expect(Chord.detect(['F', 'A', 'C', 'E'])).toContain(d.chord);
		expect(d).toMatchObject({
			kind: 'arpeggio',
			start: 0,
			end: 3,
			chord: 'Fmaj7',
			degrees: ['b7', '9', '11', '13']
		});
		expect(d.label).toContain('G9sus4 / G13sus4');
		expect(d.label).toContain('b7');
	});

	it('reads the same arpeggio going down, stacked from its lowest note', () => {
		const [d] = devicesOf('G7', 'E5 C5 A4 F4');
		expect(d).toMatchObject({ chord: 'Fmaj7', degrees: ['13', '11', '9', 'b7'] });
		expect(d.label).toContain('G13sus4');
	});

	it.each([
		['G7', 'B4 D5 F5 A5', 'Bm7b5', 'G9'],
		['Cmaj7', 'E4 G4 B4 D5', 'Em7', 'Cmaj9'],
		['Dm7', 'F4 A4 C5 E5', 'Fmaj7', 'Dm9'],
		['G7', 'Eb4 G4 Bb4', 'Eb', 'G7#5#9'],
		['Cmaj7', 'D5 F#5 A5', 'D', 'Cmaj7#11']
	])('over %s hears %s as %s, the sound of %s', (chord, line, symbol, sound) => {
		const [d] = devicesOf(chord, line);
		expect(d.chord).toBe(symbol);
		// reference: tonal 6.5.1 Chord.detect names the same chord from the pitch classes
		const names = line.split(' ').map((p) => p.replace(/\d/, ''));
		expect(Chord.detect(names).map((c) => c.replace(/M$/, ''))).toContain(symbol);
		expect(d.label).toContain(`the sound of ${sound}`);
	});

	it('calls an arpeggio of the chord itself its chord tones', () => {
		const [d] = devicesOf('G7', 'G4 B4 D5 F5');
		expect(d).toMatchObject({ chord: 'G7', degrees: ['R', '3', '5', 'b7'] });
		expect(d.label).toContain('chord tones of G7');
	});

	it('names an arpeggio without a chord in force, and finds none in steps or fourths', () => {
		expect(devicesOf(null, 'A4 C5 E5')[0]).toMatchObject({ chord: 'Am', start: 0, end: 2 });
		expect(devicesOf(null, 'A4 C5 E5')[0].degrees).toBeUndefined();
		expect(kinds('C7', 'C4 D4 E4 F4 G4')).toEqual([]);
		expect(kinds('C7', 'C4 F4 Bb4 Eb5')).toEqual([]);
	});
});

describe('analyseNotes: chromatic fills', () => {
	it('finds the D7 fill from the 3 down to the R (REFERENCES.md §3)', () => {
		const [d] = devicesOf('D7', 'F#4 F4 E4 Eb4 D4');
		expect(d).toMatchObject({
			kind: 'chromatic-fill',
			start: 0,
			end: 4,
			degrees: ['3', '#9', '9', 'b9', 'R']
		});
		expect(d.label).toContain('major third from the 3 down to the root');
		expect(d.label).toContain('fall on a beat');
	});

	it('finds the Dm7 fill from the 5 down to the b3', () => {
		const [d] = devicesOf('Dm7', 'A4 Ab4 G4 Gb4 F4');
		expect(d).toMatchObject({ start: 0, end: 4, degrees: ['5', 'b5', '11', '3', 'b3'] });
	});

	it('finds a minor-third fill going up, and no fill that does not end on a chord tone', () => {
		expect(devicesOf('C7', 'G4 Ab4 A4 Bb4')[0].label).toContain(
			'minor third from the 5 up to the b7'
		);
		expect(kinds('C7', 'A4 Ab4 G4 Gb4')).toEqual([]);
		expect(kinds(null, 'F#4 F4 E4 Eb4 D4')).toEqual([]);
	});

	it('does not say the chord tones fall on beats when the fill starts off the beat', () => {
		const [d] = devicesOf('D7', 'A4 F#4 F4 E4 Eb4 D4').filter((x) => x.kind === 'chromatic-fill');
		expect(d.start).toBe(1);
		expect(d.label).not.toContain('beat');
	});
});

describe('analyseNotes: enclosures', () => {
	it.each([
		['G7', 'C5 A#4 B4', 'A chromatic enclosure of the 3 (B)'],
		['G7', 'A#4 C5 B4', 'A chromatic enclosure of the 3 (B)'],
		['D7', 'E4 C#4 D4', 'An enclosure of the root (D)'],
		['C7', 'E4 C#4 D4', 'An enclosure of the 9 (D)']
	])('over %s finds in %s: %s', (chord, line, label) => {
		const d = devicesOf(chord, line).find((x) => x.kind === 'enclosure')!;
		expect(d).toMatchObject({ start: 0, end: 2 });
		expect(d.label).toContain(label);
	});

	it('needs one note on each side, each within a whole step, and a target that is no avoid note', () => {
		expect(kinds('G7', 'C5 C#5 B4')).toEqual([]);
		expect(kinds('G7', 'D5 A4 B4')).toEqual([]);
		expect(kinds('C7', 'G4 E4 F4')).toEqual([]);
	});
});

describe('analyseNotes: enclosures with passing tones, and what is not one', () => {
	it('reads "C7" F D D# E as an enclosure of the 3 with D# passing, not an enclosure of the #9', () => {
		// common practice: the D# moves on by the same half step to the chord tone E
		const encl = devicesOf('C7', 'F4 D4 D#4 E4').filter((d) => d.kind === 'enclosure');
		expect(encl).toHaveLength(1);
		expect(encl[0]).toMatchObject({ start: 0, end: 3, degrees: ['11', '9', '#9', '3'] });
		expect(encl[0].label).toBe(
			'An enclosure of the 3 (E) over C7: F a half step above, D a whole step below, D# a passing tone, then the target.'
		);
	});

	it('finds the same shape in every key, always aiming at the 3', () => {
		// common practice; the 3 of each dominant checked against tonal 6.5.1 Chord.get(…).notes[1]
		for (const root of ['C', 'Db', 'D', 'Eb', 'E', 'F', 'Gb', 'G', 'Ab', 'A', 'Bb', 'B']) {
			const third = Note.transpose(root + '4', '3M');
			const line = ['2m', '-2M', '-2m', '1P'].map((iv) =>
				Note.transpose(third, iv.startsWith('-') ? '-' + iv.slice(1) : iv)
			);
			const encl = devicesOf(root + '7', line.join(' ')).filter((d) => d.kind === 'enclosure');
			expect(encl, root).toHaveLength(1);
			expect(encl[0].label).toContain(`of the 3 (${Chord.get(root + '7').notes[1]})`);
		}
	});

	it('does not call the end of an arpeggio across a chord change an enclosure', () => {
		// D F# A C# spells Dmaj7; the B after the change to G7 is where the line goes, not a target
		const devices = devicesOf(['D7', 'G7'], 'D4 F#4 A4 C#5 | B4 D5');
		expect(devices.map((d) => d.kind)).toEqual(['arpeggio']);
		// the same approach notes outside an arpeggio still enclose the 3 of G7
		expect(kinds(['D7', 'G7'], 'E4 A4 C#5 | B4 D5')).toContain('enclosure');
	});

	it('labels an arpeggio over a chord outside the table from its own tones (over DmMaj7 F is the b3)', () => {
		// reference: tonal 6.5.1 ChordType.get('mMaj7').intervals is 1P 3m 5P 7M
		const [arp] = devicesOf('DmMaj7', 'D4 F4 A4 C#5');
		expect(arp.degrees).toEqual(['R', 'b3', '5', '7']);
		expect(arp.label).toContain('the chord tones of DmMaj7');
		const [nine] = devicesOf('C7#9', 'C4 E4 G4 Bb4');
		expect(nine.label).toContain('the chord tones of C7#9, R 3 5 b7');
	});
});

describe('analyseNotes: leaps', () => {
	it.each([
		['D4 Bb4', 8, 'minor sixth up'],
		['C4 G#4', 8, 'augmented fifth up'],
		['A4 C4', -9, 'major sixth down'],
		['C4 C5', 12, 'octave up'],
		['C4 E5', 16, 'major tenth up']
	])('finds a leap in %s (%i semitones): a %s', (line, semitones, words) => {
		const [d] = devicesOf('C7', line).filter((x) => x.kind === 'leap');
		expect(d).toMatchObject({ start: 0, end: 1, semitones });
		expect(d.label).toContain(words);
	});

	it('counts a minor sixth (8 semitones) and up as a leap, not a fifth', () => {
		expect(kinds('C7', 'C4 G4')).toEqual([]);
		expect(kinds('C7', 'C4 Ab4')).toEqual(['leap']);
	});
});

describe('intervalWords', () => {
	it('agrees with tonal 6.5.1 Interval.distance on the quality and number', () => {
		const cases = [
			['C4', 'Ab4'],
			['C4', 'G#4'],
			['D4', 'B4'],
			['E4', 'D5'],
			['F4', 'E5'],
			['C4', 'Eb5'],
			['B3', 'F4'],
			['C4', 'C5']
		];
		const words: Record<string, string> = {
			m: 'minor',
			M: 'major',
			P: 'perfect',
			A: 'augmented',
			d: 'diminished'
		};
		const numbers = [
			'',
			'unison',
			'second',
			'third',
			'fourth',
			'fifth',
			'sixth',
			'seventh',
			'octave',
			'ninth',
			'tenth'
		];
		for (const [a, b] of cases) {
			// reference: tonal 6.5.1 Interval.distance
			const iv = Interval.get(Interval.distance(a, b));
			const expected =
				iv.num === 8 && iv.q === 'P' ? 'octave' : `${words[iv.q]} ${numbers[iv.num]}`;
			expect(intervalWords(a, b), `${a}-${b}`).toBe(expected);
		}
	});
});

describe('analyseNotes: degrees', () => {
	it('labels each note over its chord in force, and none before the first chord', () => {
		const r = analyseNotes(lineOver([null, 'E7'], 'E4 | F4 G4 A4 C5 C#5'));
		expect(r.degrees.map((d) => d?.label ?? null)).toEqual([null, 'b9', '#9', '11', 'b13', '13']);
	});

	it('returns nothing for an empty line and sorts devices by where they start', () => {
		expect(analyseNotes([])).toEqual({ degrees: [], devices: [] });
		const devices = devicesOf('G7', 'C5 A#4 B4 D4 F4 A4 C5 E5');
		expect(devices.map((d) => d.start)).toEqual(
			[...devices.map((d) => d.start)].sort((a, b) => a - b)
		);
		expect(devices.map((d) => d.kind)).toEqual(['enclosure', 'leap', 'arpeggio']);
	});
});

describe('analyseNotes: longer arpeggios', () => {
	it('names a run of five thirds by its first four notes and keeps every degree', () => {
		const [d] = devicesOf('G7', 'D5 F5 A5 C6 E6');
		expect(d).toMatchObject({
			chord: 'Dm7',
			start: 0,
			end: 4,
			degrees: ['5', 'b7', '9', '11', '13']
		});
		expect(d.label).toContain('built on its 5');
		expect(d.label).toContain('the sound of G11');
	});

	it('names a falling run of five thirds from the lowest of its first four notes', () => {
		const [d] = devicesOf('G7', 'E6 C6 A5 F5 D5');
		expect(d).toMatchObject({ chord: 'Fmaj7', degrees: ['13', '11', '9', 'b7', '5'] });
		expect(d.label).toContain('built on its b7');
	});
});

describe('analyseNotes on random lines', () => {
	const SYMBOLS = [
		null,
		'C7',
		'Dm7',
		'Ebmaj7',
		'F#m7b5',
		'G7alt',
		'Bbo7',
		'A6',
		'Em6',
		'Db7sus4',
		'C+'
	];

	it('never throws and returns devices inside the line, with one degree per note', () => {
		fc.assert(
			fc.property(
				fc.array(fc.tuple(fc.integer({ min: 40, max: 90 }), fc.constantFrom(...SYMBOLS)), {
					maxLength: 40
				}),
				(cells) => {
					const notes = cells.map(([midi, symbol], index) => ({
						index,
						pitch: Note.fromMidi(midi),
						midi,
						start: index / 8,
						duration: 1 / 8,
						chord: symbol ? chordOf(symbol) : null
					}));
					const r = analyseNotes(notes);
					expect(r.degrees).toHaveLength(notes.length);
					for (const d of r.devices) {
						expect(d.start).toBeGreaterThanOrEqual(0);
						expect(d.end).toBeGreaterThan(d.start);
						expect(d.end).toBeLessThan(notes.length);
						expect(d.label.length).toBeGreaterThan(10);
						if (d.degrees) expect(d.degrees).toHaveLength(d.end - d.start + 1);
					}
				}
			),
			{ numRuns: 300 }
		);
	});
});
