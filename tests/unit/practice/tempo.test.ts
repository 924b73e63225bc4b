import { describe, expect, it } from 'vitest';
import {
	floorTempo,
	nextRung,
	promptTempo,
	stretchTempo,
	tempoStep
} from '../../../src/lib/practice/tempo';

describe('tempo ladder', () => {
	it('starts a card never graded a little under its target, then at its rung', () => {
		expect(promptTempo(null, 160)).toBe(128);
		expect(promptTempo(null, 40)).toBe(32);
		expect(promptTempo(144, 160)).toBe(144);
		expect([tempoStep(160), stretchTempo(160), floorTempo(160)]).toEqual([8, 176, 80]);
	});

	it.each([
		// rung, played, grade, target → next rung
		[120, 120, 4, 160, 128], // top grade at the rung: a step toward the target
		[156, 156, 4, 160, 160], // …never past the target until the target is held
		[160, 160, 4, 160, 168], // held at the target: past it toward the stretch tempo
		[172, 172, 4, 160, 176], // …up to the stretch tempo and no further
		[176, 176, 4, 160, 176],
		[120, 110, 4, 160, 120], // a top grade below the rung does not lower it
		[120, 120, 3, 160, 120], // good: stays
		[120, 136, 3, 160, 136], // good at a faster tempo the learner chose: the rung follows
		[120, 120, 2, 160, 120], // hard: stays
		[120, 120, 1, 160, 112], // failure: a step back
		[84, 84, 1, 160, 80], // …never below the floor
		[null, 128, 4, 160, 136], // first grade from the start tempo
		[null, 128, 1, 160, 120]
	] as const)(
		'rung %s, played %i, grade %i, target %i → %i',
		(rung, played, grade, target, out) => {
			expect(nextRung({ rung, played, grade, target })).toBe(out);
		}
	);

	it('climbs from the start to the stretch tempo with top grades only, then holds', () => {
		let rung: number | null = null;
		const seen: number[] = [];
		for (let i = 0; i < 12; i++) {
			const played = promptTempo(rung, 200);
			rung = nextRung({ rung, played, grade: 4, target: 200 });
			seen.push(rung);
		}
		expect(seen).toEqual([170, 180, 190, 200, 210, 220, 220, 220, 220, 220, 220, 220]);
	});
});
