import { describe, expect, it } from 'vitest';
import {
	buildPerformance,
	PerformanceError,
	shellVoicing,
	swingBeats,
	type PerformanceNote
} from '../../../src/lib/audio/performance';

const eighth = 1 / 8;

describe('swingBeats', () => {
	// Common practice (REFERENCES.md §5): long = beat·r/(1+r), short = beat/(1+r).
	it.each([
		[0, 2, 0],
		[0.5, 2, 2 / 3],
		[1, 2, 1],
		[1.5, 2, 1 + 2 / 3],
		[0.5, 1, 0.5],
		[0.5, 3, 0.75],
		[0.25, 2, 1 / 3],
		[0.75, 2, 2 / 3 + 1 / 6]
	])('moves position %d at ratio %d to %d', (beats, ratio, expected) => {
		expect(swingBeats(beats, ratio)).toBeCloseTo(expected, 9);
	});

	it.each([0, -1, Number.NaN, Infinity])('refuses the ratio %d', (ratio) => {
		expect(() => swingBeats(0.5, ratio)).toThrow(PerformanceError);
	});
});

describe('shellVoicing', () => {
	// Chord tones from tonal 6.5.1 Chord.get; placement is our own rule (bass in octave 2,
	// guide tones between E3 and E4).
	it.each([
		['Dm7', [38, 53, 60]], // D2, F3, C4
		['C7', [36, 52, 58]], // C2, E3, Bb3
		['G7', [43, 59, 53]], // G2, B3, F3
		['Fmaj7', [41, 57, 52]], // F2, A3, E3
		['C6', [36, 52, 57]], // C2, E3, A3
		['C7sus4', [36, 53, 58]], // C2, F3, Bb3
		['Bb7/D', [38, 62, 56]] // slash bass D2 under D4 and Ab3
	])('voices %s as %j', (symbol, midi) => {
		expect(shellVoicing(symbol)).toEqual(midi);
	});

	it.each(['', 'H7', 'zzz', '/'])('gives nothing for the non-chord %j', (symbol) => {
		expect(shellVoicing(symbol)).toEqual([]);
	});
});

describe('buildPerformance', () => {
	const line: PerformanceNote[] = [
		{ midi: 60, start: 0, duration: eighth, chord: 'C7' },
		{ midi: 62, start: eighth, duration: eighth, chord: 'C7' },
		{ midi: 64, start: 2 * eighth, duration: 2 * eighth, chord: 'F7' }
	];

	it('swings a pair of eighths at 120 bpm into 333 ms and 167 ms after a four-beat count-in', () => {
		// Common practice, REFERENCES.md §5: 120 bpm at 2:1 → 333.3 ms and 166.7 ms.
		const { events } = buildPerformance(line, { bpm: 120, swingRatio: 2, countInBeats: 4 });
		const melody = events.filter((e) => e.part === 'melody');
		expect(melody.map((e) => e.time)).toEqual([2, 2 + 1 / 3, 2.5].map((t) => expect.closeTo(t, 9)));
		expect(melody[0].duration).toBeCloseTo(1 / 3, 9);
		expect(melody[1].duration).toBeCloseTo(1 / 6, 9);
	});

	it('clicks one bar before the line, accenting the first beat', () => {
		const { events } = buildPerformance(line, { bpm: 120, swingRatio: 2, countInBeats: 4 });
		const clicks = events.filter((e) => e.part === 'click');
		expect(clicks.map((c) => [c.time, c.accent])).toEqual([
			[0, true],
			[0.5, false],
			[1, false],
			[1.5, false]
		]);
	});

	it('holds each chord until the next chord symbol and the last until the line ends', () => {
		const { events, totalSeconds } = buildPerformance(line, {
			bpm: 60,
			swingRatio: 1,
			countInBeats: 0
		});
		const chords = events.filter((e) => e.part === 'chord');
		expect(chords).toEqual([
			{ part: 'chord', midi: [36, 52, 58], time: 0, duration: 1 },
			{ part: 'chord', midi: [41, 57, 63], time: 1, duration: 1 }
		]);
		expect(totalSeconds).toBe(2);
	});

	it('plays straight eighths at ratio 1 and skips chords that name nothing', () => {
		const notes: PerformanceNote[] = [
			{ midi: 67, start: 0, duration: eighth, chord: null },
			{ midi: 65, start: eighth, duration: eighth, chord: 'not a chord' }
		];
		const { events } = buildPerformance(notes, { bpm: 60, swingRatio: 1, countInBeats: 0 });
		expect(events).toEqual([
			{ part: 'melody', midi: [67], time: 0, duration: 0.5 },
			{ part: 'melody', midi: [65], time: 0.5, duration: 0.5 }
		]);
	});

	it.each([
		[{ bpm: 0, swingRatio: 2, countInBeats: 4 }],
		[{ bpm: 1000, swingRatio: 2, countInBeats: 4 }],
		[{ bpm: 120, swingRatio: 2, countInBeats: -1 }],
		[{ bpm: 120, swingRatio: 2, countInBeats: 2.5 }],
		[{ bpm: Number.NaN, swingRatio: 2, countInBeats: 4 }]
	])('refuses the options %j', (options) => {
		expect(() => buildPerformance(line, options)).toThrow(PerformanceError);
	});

	it('refuses a note without a positive length', () => {
		const bad = [{ midi: 60, start: 0, duration: 0, chord: null }];
		expect(() => buildPerformance(bad, { bpm: 120, swingRatio: 2, countInBeats: 0 })).toThrow(
			/positive length/
		);
	});
});
