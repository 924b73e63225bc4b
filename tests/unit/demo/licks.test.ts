import { describe, expect, it } from 'vitest';
import { DEMO_DECKS, DEMO_LICKS } from '../../../src/lib/demo/licks';
import { CYCLE_OF_FOURTHS } from '../../../src/lib/music/key-data';
import { computeGrid, computeVariant, type VariantSuccess } from '../../../src/lib/music/engine';
import { QUALITY_IDS } from '../../../src/lib/music/types';

const variantOf = (abc: string) => {
	const result = computeVariant({ abc });
	if (!result.ok) throw new Error(result.error.message);
	return result as VariantSuccess;
};

describe('the demo licks', () => {
	it('have unique slugs and titles and belong to a known deck', () => {
		expect(new Set(DEMO_LICKS.map((l) => l.slug)).size).toBe(DEMO_LICKS.length);
		expect(new Set(DEMO_LICKS.map((l) => l.title)).size).toBe(DEMO_LICKS.length);
		const decks = DEMO_DECKS.map((d) => d.slug) as string[];
		for (const l of DEMO_LICKS) expect(decks).toContain(l.deck);
		for (const d of decks) expect(DEMO_LICKS.filter((l) => l.deck === d).length).toBe(4);
	});

	it.each(DEMO_LICKS.map((l) => [l.title, l] as const))(
		'%s renders in all twelve keys over every quality without an error',
		(_, lick) => {
			const grid = computeGrid(lick.abc, CYCLE_OF_FOURTHS, QUALITY_IDS, 'concert');
			expect(grid.ok).toBe(true);
			if (grid.ok) expect(grid.variants).toHaveLength(12 * QUALITY_IDS.length);
		}
	);

	it.each(DEMO_LICKS.filter((l) => l.devices.length).map((l) => [l.title, l] as const))(
		'%s shows the device its teaching note is about',
		(_, lick) => {
			const kinds = (variantOf(lick.abc).devices ?? []).map((d) => d.kind);
			for (const kind of lick.devices) expect(kinds).toContain(kind);
		}
	);

	it('label the degrees the teaching notes name (common practice, REFERENCES.md §3)', () => {
		const degrees = (slug: string) =>
			variantOf(DEMO_LICKS.find((l) => l.slug === slug)!.abc).notes.map((n) => n.degree);
		// Over D7, F# F E Eb D are 3 #9 9 b9 R (REFERENCES.md §3 worked example).
		expect(degrees('slow-slide').slice(0, 5)).toEqual(['3', '#9', '9', 'b9', 'R']);
		// Fmaj7 from the b7 of G7: b7 9 11 13 (REFERENCES.md §3 worked example).
		expect(degrees('tin-roof').slice(0, 4)).toEqual(['b7', '9', '11', '13']);
		// Down the G altered scale (tonal Scale.get('G altered'): G Ab Bb Cb Db Eb F).
		expect(degrees('night-bus').slice(0, 8)).toEqual([
			'b13',
			'#9',
			'R',
			'b7',
			'b13',
			'#11',
			'3',
			'b9'
		]);
	});
});
