/**
 * Octaves: a lick sounds where it was written unless the learner's instrument range forces a move,
 * and then a warning says so (common practice; ranges from memory: S. Adler, The Study of
 * Orchestration, 2002; D. Lowell & K. Pullig, Arranging for Large Jazz Ensemble, 2003).
 */
import { describe, expect, it } from 'vitest';
import {
	computeVariant,
	prepareLick,
	renderVariant,
	type VariantSuccess
} from '../../../src/lib/music/engine';
import { DEMO_LICKS } from '../../../src/lib/demo/licks';
import { INSTRUMENT_IDS } from '../../../src/lib/music/instruments';

const variant = (abc: string, options: Record<string, string> = {}): VariantSuccess => {
	const r = computeVariant({ abc, ...options });
	if (!r.ok) throw new Error(r.error.message);
	return r;
};
const TWELVE = ['C', 'F', 'Bb', 'Eb', 'Ab', 'Db', 'Gb', 'B', 'E', 'A', 'D', 'G'];

describe('octaves', () => {
	it('sounds every demo lick where it is written unless the range forces a move, which a warning names (12 keys × every instrument)', () => {
		for (const lick of DEMO_LICKS) {
			const prepared = prepareLick(lick.abc);
			if (!prepared.ok) throw new Error(prepared.error.message);
			for (const to of TWELVE) {
				const concert = renderVariant(prepared.lick, { to }).notes.map((n) => n.midi);
				for (const instrument of INSTRUMENT_IDS) {
					const v = renderVariant(prepared.lick, { to, instrument });
					const moved = v.warnings.some((w) => w.code === 'octave-moved');
					const shift = v.notes[0].midi - concert[0];
					expect(Math.abs(shift % 12)).toBe(0);
					expect(v.notes.map((n) => n.midi - concert[v.notes.indexOf(n)])).toEqual(
						concert.map(() => shift)
					);
					// A move happens with a warning, and only then (or with a note left out of range).
					if (shift !== 0)
						expect(moved || v.warnings.some((w) => w.code === 'out-of-range')).toBe(true);
					else expect(moved).toBe(false);
				}
			}
		}
	}, 60_000);

	it('keeps a guitar line at the pitch it sounds (concert C4 stays C4, written C5)', () => {
		const v = variant('X:1\nL:1/8\nK:C\n"C7"C E G _B|]', { instrument: 'guitar' });
		expect(v.notes.map((n) => n.pitch)).toEqual(['C4', 'E4', 'G4', 'Bb4']);
		// Guitar is written an octave above what sounds (REFERENCES.md §4, abc 2.1 §4.6 treble-8).
		expect(v.notes.map((n) => n.writtenPitch)).toEqual(['C5', 'E5', 'G5', 'Bb5']);
		expect(v.warnings).toEqual([]);
	});

	it.each(['trombone', 'flute', 'guitar', 'bass', 'concert', 'piano'])(
		'writes the spelling asked for after a range move on %s (F# asked, F# written)',
		(instrument) => {
			for (const abc of [
				'X:1\nL:1/8\nK:C\n"C7"c e g _b c\'2|]',
				'X:1\nL:1/8\nK:C\n"C7"C, E, G, _B,|]'
			])
				for (const tritone of ['Gb', 'F#']) {
					const v = variant(abc, { to: 'F#', instrument, tritone });
					expect([v.key, v.writtenTonic]).toEqual(['F#', 'F#']);
					expect(variant(abc, { to: 'Gb', instrument, tritone }).writtenTonic).toBe('Gb');
				}
		}
	);

	it('spells K:none output’s chord tones from the chord (E7 moved to F#7 has A#, not Bb)', () => {
		// K:none transposes as if in C (abc 2.1 §3.1.14 has no tonic for it): C → D moves E7 to F#7.
		const v = variant('X:1\nL:1/8\nK:none\n"E7"E _A B d|]', { to: 'D' });
		expect(v.notes.map((n) => n.pitch)).toEqual(['F#4', 'A#4', 'C#5', 'E5']);
		expect(v.abc).toContain('"F#7"^F ^A ^c e');
	});
});
