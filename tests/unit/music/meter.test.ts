import { describe, expect, it } from 'vitest';
import { beatsPerBar, readTempo } from '../../../src/lib/music/meter';
import { computeVariant } from '../../../src/lib/music/engine';

describe('readTempo', () => {
	// abc standard 2.1 §3.1.8 for the Q: forms.
	it.each([
		['1/4=132', 132],
		['1/2=60', 120],
		['3/8=40', 60],
		['100', 100],
		['"Allegro" 1/4=120', 120],
		['fast', null],
		['1/4=0', null]
	])('reads Q:%s as %s quarters a minute', (value, bpm) => {
		expect(readTempo(value)).toBe(bpm);
	});
});

describe('beatsPerBar', () => {
	// abc standard 2.1 §3.1.6 for the M: forms; the pulse per meter is common practice.
	it.each([
		['4/4', 4],
		['3/4', 3],
		['6/8', 2],
		['12/8', 4],
		['5/8', 5],
		['2/2', 4],
		['C', 4],
		['C|', 4],
		['none', 4],
		['', 4],
		['0/4', 4]
	])('counts in M:%s with %d beats', (meter, beats) => {
		expect(beatsPerBar(meter)).toBe(beats);
	});
});

describe('the engine answer carries meter and tempo', () => {
	it('so that no screen reads the abc text again', () => {
		const v = computeVariant({ abc: 'X:1\nM:6/8\nQ:3/8=40\nK:C\n"C7"CEG cBA|]\n', to: 'F' });
		if (!v.ok) throw new Error(v.error.message);
		expect({ meter: v.meter, beatsPerBar: v.beatsPerBar, tempo: v.tempo }).toEqual({
			meter: '6/8',
			beatsPerBar: 2,
			tempo: 60
		});
	});
});
