import { describe, expect, it } from 'vitest';
import {
	buildChangesPerformance,
	buildPerformance,
	chordSpans,
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

describe('loop lengths', () => {
	it('rounds a pass up to whole bars so the next pass starts on a downbeat', () => {
		// Six eighths in 4/4 at 120 bpm: one bar of 2 s, after a 2 s count-in.
		const notes = Array.from({ length: 6 }, (_, i) => ({
			midi: 60 + i,
			start: i * eighth,
			duration: eighth,
			chord: 'C7'
		}));
		const p = buildPerformance(notes, { bpm: 120, swingRatio: 2, countInBeats: 4 });
		expect([p.countInSeconds, p.loopSeconds]).toEqual([2, 2]);
		const waltz = buildPerformance(notes, {
			bpm: 120,
			swingRatio: 2,
			countInBeats: 3,
			barBeats: 3
		});
		expect([waltz.countInSeconds, waltz.loopSeconds]).toEqual([1.5, 1.5]);
	});

	it('refuses a bar of no beats', () => {
		expect(() =>
			buildPerformance([], { bpm: 120, swingRatio: 2, countInBeats: 0, barBeats: 0 })
		).toThrow(PerformanceError);
	});
});

describe('chordSpans', () => {
	it('holds each chord from its first note to the next chord, the last to the end of its bar', () => {
		const notes: PerformanceNote[] = [
			{ midi: 62, start: eighth, duration: eighth, chord: 'Dm7' },
			{ midi: 65, start: 2 * eighth, duration: eighth, chord: 'Dm7' },
			{ midi: 67, start: 0.5, duration: eighth, chord: 'G7' },
			{ midi: 64, start: 1, duration: 0.25, chord: 'Cmaj7' }
		];
		expect(chordSpans(notes)).toEqual([
			{ symbol: 'Dm7', start: 0, duration: 0.5 },
			{ symbol: 'G7', start: 0.5, duration: 0.5 },
			{ symbol: 'Cmaj7', start: 1, duration: 1 }
		]);
	});

	it('leaves out notes before any chord and symbols that name no chord', () => {
		const notes: PerformanceNote[] = [
			{ midi: 60, start: 0, duration: eighth, chord: null },
			{ midi: 60, start: eighth, duration: eighth, chord: 'N.C.' },
			{ midi: 60, start: 0.25, duration: eighth, chord: 'F7' }
		];
		expect(chordSpans(notes)).toEqual([{ symbol: 'F7', start: 0, duration: 1 }]);
	});
});

describe('buildChangesPerformance', () => {
	it('plays root and fifth in the bass and comps the guide tones on 1 and the and of 2', () => {
		// Chord tones from tonal 6.5.1 Chord.get (C7: C E G Bb); the comping figure is common practice.
		const p = buildChangesPerformance([{ symbol: 'C7', start: 0, duration: 1 }], {
			bpm: 60,
			swingRatio: 1,
			countInBeats: 0
		});
		expect(p.events.map((e) => [e.time, e.midi, e.duration])).toEqual([
			[0, [36], 2],
			[0, [52, 58], 1],
			[1.5, [52, 58], 1],
			[2, [43], 2]
		]);
		expect(p.loopSeconds).toBe(4);
		expect(p.events.every((e) => e.part === 'chord')).toBe(true);
	});

	it('walks to the diminished fifth under a half-diminished chord and comps again at each change', () => {
		// Dm7b5: D F Ab C (tonal 6.5.1 Chord.get).
		const p = buildChangesPerformance(
			[
				{ symbol: 'Dm7b5', start: 0, duration: 0.5 },
				{ symbol: 'G7', start: 0.5, duration: 0.5 }
			],
			{ bpm: 60, swingRatio: 2, countInBeats: 2 }
		);
		const bass = p.events.filter((e) => e.midi.length === 1 && e.part === 'chord');
		expect(bass.map((e) => [e.time, e.midi[0]])).toEqual([
			[2, 38],
			[4, 43]
		]);
		const comp = p.events.filter((e) => e.midi.length > 1);
		// The and of 2 swung at 2:1 falls at 1 + 2/3 beats.
		expect(comp.map((e) => e.time)).toEqual([2, 2 + 1 + 2 / 3, 4].map((t) => expect.closeTo(t, 9)));
		expect(p.events.filter((e) => e.part === 'click')).toHaveLength(2);
	});

	it('refuses a chord without a length', () => {
		expect(() =>
			buildChangesPerformance([{ symbol: 'C7', start: 0, duration: 0 }], {
				bpm: 120,
				swingRatio: 2,
				countInBeats: 0
			})
		).toThrow(/positive length/);
	});
});
