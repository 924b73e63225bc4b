import { describe, expect, it } from 'vitest';
import { Note } from 'tonal';
import {
	fitToRange,
	getInstrument,
	INSTRUMENT_IDS,
	isInstrumentId,
	writtenPitch,
	type InstrumentId
} from '../../../src/lib/music/instruments';

const midi = (name: string) => Note.midi(name)!;

describe('writtenPitch', () => {
	// REFERENCES.md §4 (concert = written + n; MusicXML 4.0 <transpose> chromatic/octave values).
	it.each([
		['concert', 'C4', 'C4', 0],
		['concert-bass', 'C4', 'C4', 0],
		['trumpet', 'C4', 'D4', -2],
		['clarinet', 'C4', 'D4', -2],
		['soprano-sax', 'C4', 'D4', -2],
		['tenor-sax', 'C4', 'D5', -14],
		['alto-sax', 'C4', 'A4', -9],
		['baritone-sax', 'C4', 'A5', -21],
		['guitar', 'C4', 'C5', -12],
		['bass', 'C2', 'C3', -12],
		['trombone', 'C4', 'C4', 0],
		['flute', 'C4', 'C4', 0],
		['piano', 'C4', 'C4', 0],
		['vibraphone', 'C4', 'C4', 0]
	] as const)(
		'on %s writes concert %s as %s (concert = written %i semitones)',
		(id, concert, written, n) => {
			expect(writtenPitch(concert, id)).toBe(written);
			// reference: tonal 6.5.1 Note.transpose with the row's interval
			expect(Note.transpose(concert, getInstrument(id).written)).toBe(written);
			expect(midi(concert) - midi(written)).toBe(n);
			expect(getInstrument(id).semitones + n).toBe(0);
		}
	);

	it.each([
		['alto-sax', 'Eb4', 'C5'],
		['trumpet', 'F#4', 'G#4'],
		['tenor-sax', 'Db4', 'Eb5'],
		['baritone-sax', 'Bb2', 'G4'],
		['clarinet', 'Bb3', 'C4']
	] as const)(
		'keeps letters right on %s: concert %s is written %s, by interval',
		(id, concert, written) => {
			expect(writtenPitch(concert, id)).toBe(written);
			// reference: tonal 6.5.1 Note.transpose
			expect(Note.transpose(concert, getInstrument(id).written)).toBe(written);
		}
	);

	it('shifts the written pitch by whole octaves when asked', () => {
		expect(writtenPitch('C4', 'tenor-sax', -1)).toBe('D4');
		expect(writtenPitch('G3', 'flute', 1)).toBe('G4');
	});

	it('throws on a pitch or instrument it does not know, naming it', () => {
		expect(() => writtenPitch('H4', 'flute')).toThrow("'H4'");
		expect(() => writtenPitch('C4', 'oboe' as InstrumentId)).toThrow("'oboe'");
	});
});

describe('instrument table', () => {
	// Practical written ranges (REFERENCES.md §4): S. Adler, The Study of Orchestration (2002), and
	// D. Lowell & K. Pullig, Arranging for Large Jazz Ensemble (2003), from memory.
	it.each([
		['trumpet', 'F#3', 'C6'],
		['alto-sax', 'Bb3', 'F6'],
		['tenor-sax', 'Bb3', 'F6'],
		['baritone-sax', 'Bb3', 'F6'],
		['soprano-sax', 'Bb3', 'F6'],
		['guitar', 'E3', 'E6'],
		['bass', 'E2', 'G4'],
		['trombone', 'E2', 'Bb4'],
		['flute', 'C4', 'C7'],
		['vibraphone', 'F3', 'F6'],
		['piano', 'C4', 'C6']
	] as const)('gives %s the written range %s–%s', (id, low, high) => {
		expect(getInstrument(id)).toMatchObject({ low: midi(low), high: midi(high) });
	});

	it('writes guitar in treble-8 with tablature, bass instruments in bass clef', () => {
		expect(getInstrument('guitar')).toMatchObject({ clef: 'treble-8', tablature: 'guitar' });
		expect(getInstrument('bass').clef).toBe('bass');
		expect(getInstrument('trombone').clef).toBe('bass');
		expect(getInstrument('concert-bass').clef).toBe('bass');
		for (const id of INSTRUMENT_IDS)
			expect(getInstrument(id).low).toBeLessThan(getInstrument(id).high);
	});

	it.each([
		['alto-sax', true],
		['tuba', false],
		['', false],
		[null, false],
		[9, false]
	])('isInstrumentId(%j) is %s', (value, expected) => {
		expect(isInstrumentId(value)).toBe(expected);
	});
});

describe('fitToRange', () => {
	const line = ['C4', 'E4', 'G4', 'Bb4', 'D5'].map(midi);

	it('keeps the line where it is when that is nearest the middle of the range', () => {
		expect(fitToRange(line, 'trumpet')).toEqual({ octaveShift: 0, warnings: [] });
		expect(fitToRange(line, 'alto-sax')).toEqual({ octaveShift: 0, warnings: [] });
	});

	it('keeps the line where it sounds unless the range forces a move, and says so when it moves', () => {
		// A lick sounds where it was written (common practice): tenor writes C4–D5 as D5–E6, inside
		// B-flat3–F6, so it stays.
		expect(fitToRange(line, 'tenor-sax')).toEqual({ octaveShift: 0, warnings: [] });
		// Trombone reads E2–B-flat4: D5 is above it, so the line moves down an octave, with a warning.
		const trombone = fitToRange(line, 'trombone');
		expect(trombone.octaveShift).toBe(-1);
		expect(trombone.warnings).toEqual([
			expect.objectContaining({ code: 'octave-moved', message: expect.stringContaining('lower') })
		]);
		// flute C4–C7: a line two octaves down comes up by the least that fits, two octaves
		const low = line.map((m) => m - 24);
		expect(fitToRange(low, 'flute').octaveShift).toBe(2);
		expect(fitToRange(line, 'bass').octaveShift).toBe(-2);
	});

	it('puts every written note inside the range whenever some octave allows it', () => {
		for (const id of INSTRUMENT_IDS) {
			const i = getInstrument(id);
			const { octaveShift, warnings } = fitToRange(line, id);
			expect(
				warnings.filter((w) => w.code !== 'octave-moved'),
				id
			).toEqual([]);
			for (const m of line) {
				const w = m + i.semitones + 12 * octaveShift;
				expect(w, id).toBeGreaterThanOrEqual(i.low);
				expect(w, id).toBeLessThanOrEqual(i.high);
			}
		}
	});

	it('warns when no octave fits, naming the notes left outside', () => {
		const wide = ['C3', 'G4', 'E6'].map(midi);
		const r = fitToRange(wide, 'trumpet');
		expect(r.warnings).toHaveLength(1);
		expect(r.warnings[0]).toMatchObject({ code: 'out-of-range' });
		expect(r.warnings[0].message).toContain('more than');
		expect(r.warnings[0].message).toContain('F#3–C6');
		expect(r.warnings[0].notes!.length).toBeGreaterThan(0);
		const outside = r.warnings[0].notes!.map((i) => wide[i] + 2 + 12 * r.octaveShift);
		for (const w of outside) expect(w < midi('F#3') || w > midi('C6')).toBe(true);
	});

	it('warns when the line is narrow enough but no octave shift lands it inside the range', () => {
		// 21 semitones on piano's C4–C6 (24): only an A3–F#5-shaped placement would fit, not B3–G#5
		const r = fitToRange(['B3', 'G#5'].map(midi), 'piano');
		expect(r.warnings[0].message).toContain('No octave puts the whole line');
		expect(r.warnings[0].notes).toEqual([0]);
	});

	it('answers an empty line with no shift and no warning', () => {
		expect(fitToRange([], 'guitar')).toEqual({ octaveShift: 0, warnings: [] });
	});
});
