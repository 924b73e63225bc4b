import { describe, expect, it } from 'vitest';
import { AbcNotation, Interval, Note } from 'tonal';
import {
	abcLetter,
	formatPitch,
	intervalName,
	midiOf,
	parseNoteName,
	parsePitchName,
	stepsBetween,
	transposePitch
} from '../../../src/lib/music/pitch';

const NAMES = ['C4', 'C#4', 'Db4', 'B#3', 'Cb4', 'E#5', 'Fb2', 'F##4', 'Gbb3', 'Bb-1', 'A0', 'C8'];

describe('pitch', () => {
	it('gives the same MIDI numbers as tonal 6.5.1 Note.midi for spelled pitches', () => {
		for (const name of NAMES) {
			const p = parsePitchName(name);
			expect(p, name).not.toBeNull();
			// reference: tonal 6.5.1 Note.midi
			expect(midiOf(p!), name).toBe(Note.midi(name));
			expect(formatPitch(p!)).toBe(name);
		}
	});

	it.each([
		['F#', { letter: 3, alt: 1 }],
		['Bb', { letter: 6, alt: -1 }],
		['E♭', { letter: 2, alt: -1 }],
		['Fx', { letter: 3, alt: 2 }],
		['c', { letter: 0, alt: 0 }],
		['H', null],
		['', null],
		['C###', null],
		['Bbb', { letter: 6, alt: -2 }]
	])('reads the note name %j', (name, expected) => {
		expect(parseNoteName(name)).toEqual(expected);
	});

	it('rejects garbage pitch names', () => {
		for (const bad of ['', 'C', '4', 'X4', 'C#', 'C4.5'])
			expect(parsePitchName(bad), bad).toBeNull();
	});

	it('writes abc letters with octave marks as abc 2.1 §4.1 and tonal AbcNotation do', () => {
		for (const name of ['C4', 'C5', 'C3', 'B2', 'C6', 'G7', 'E1']) {
			const p = parsePitchName(name)!;
			// reference: tonal 6.5.1 AbcNotation.scientificToAbcNotation (natural notes)
			expect(abcLetter(p), name).toBe(AbcNotation.scientificToAbcNotation(name));
		}
		// abc 2.1 §4.1: C, is MIDI 48 and c' is MIDI 84
		expect(midiOf({ letter: 0, alt: 0, octave: 3 })).toBe(48);
		expect(abcLetter({ letter: 0, alt: 0, octave: 3 })).toBe('C,');
		expect(abcLetter({ letter: 0, alt: 0, octave: 6 })).toBe("c'");
	});

	it('transposes by interval exactly as tonal Note.transpose does', () => {
		const intervals = [
			'1P',
			'2M',
			'2m',
			'3M',
			'3m',
			'4P',
			'4A',
			'5d',
			'5P',
			'6M',
			'6m',
			'7M',
			'7m',
			'-2M',
			'-3m',
			'-4P',
			'-5d',
			'8P',
			'-8P'
		];
		for (const name of ['C4', 'Bb3', 'F#4', 'Eb5', 'B4', 'Gb4']) {
			for (const iv of intervals) {
				const i = Interval.get(iv);
				const steps = i.num - Math.sign(i.num) || 0;
				const by = { steps: i.dir < 0 ? -Math.abs(steps) : steps, semitones: i.semitones };
				// reference: tonal 6.5.1 Note.transpose
				expect(formatPitch(transposePitch(parsePitchName(name)!, by)), `${name} + ${iv}`).toBe(
					Note.transpose(name, iv)
				);
			}
		}
	});

	it('measures upward intervals between pitch classes like tonal Interval.distance', () => {
		const pairs = [
			['C', 'G'],
			['C', 'Gb'],
			['Bb', 'C'],
			['E', 'C'],
			['F#', 'Db'],
			['C', 'B#'],
			['A', 'Eb'],
			['Db', 'B']
		];
		for (const [a, b] of pairs) {
			const iv = stepsBetween(parseNoteName(a)!, parseNoteName(b)!);
			// reference: tonal 6.5.1 Interval.distance on pitch classes (always upward)
			expect(intervalName(iv), `${a} → ${b}`).toBe(Interval.distance(a, b));
		}
	});
});
