import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { prepareLick } from '../../../../src/lib/music/engine';
import { QUALITY_IDS } from '../../../../src/lib/music/types';
import { DEMO_LICKS } from '../../../../src/lib/demo/licks';
import {
	configureEngineBudget,
	estimateAnswerBytes,
	MAX_ANSWER_BYTES,
	renderLickGrid,
	renderLickVariant
} from '../../../../src/lib/server/music/render';

const BENCH = readFileSync(
	new URL('../../../fixtures/licks/bench-four-bars.abc', import.meta.url),
	'utf8'
);
const KEYS = ['C', 'F', 'Bb', 'Eb', 'Ab', 'Db', 'Gb', 'B', 'E', 'A', 'D', 'G'];

describe('renderLickGrid and renderLickVariant', () => {
	it.each([...DEMO_LICKS.map((l) => [l.slug, l.abc]), ['bench four bars', BENCH]])(
		'estimates the answer of %s above its real JSON size, and under the cap for a full grid',
		async (_, abc) => {
			configureEngineBudget();
			const grid = await renderLickGrid(
				{ abc },
				{ keys: KEYS, qualities: [...QUALITY_IDS], instrument: 'alto-sax' }
			);
			if (!grid.ok) throw new Error(grid.message);
			const real = JSON.stringify(grid.value).length;
			const lick = prepareLick(abc);
			if (!lick.ok) throw new Error(lick.error.message);
			const estimate = estimateAnswerBytes(lick.lick, KEYS.length * QUALITY_IDS.length);
			expect(estimate).toBeGreaterThanOrEqual(real);
			expect(estimate).toBeLessThanOrEqual(MAX_ANSWER_BYTES);
		}
	);

	it('answers one variant with its devices and the names the learner reads', async () => {
		configureEngineBudget();
		const r = await renderLickVariant(
			{ abc: DEMO_LICKS[1].abc },
			{ to: 'Eb', instrument: 'alto-sax' }
		);
		if (!r.ok) throw new Error(r.message);
		// Alto saxophone reads a major sixth above concert (REFERENCES.md §4): Eb sounds, C is written.
		expect(r.value).toMatchObject({ key: 'Eb', concertKey: 'Eb', writtenTonic: 'C', tempo: 120 });
		expect(r.value.devices?.map((d) => d.kind)).toContain('enclosure');
		expect(r.value).not.toHaveProperty('ok');
	});

	it('refuses a bad abc text with 422 and its position', async () => {
		const r = await renderLickVariant({ abc: 'X:1\nK:C\n"C7 C|' });
		expect(r).toMatchObject({ ok: false, status: 422, line: 3 });
	});

	it('lets other work run between the keys of a heavy grid', async () => {
		// Slices of no length: the grid gives the event loop back after every key.
		configureEngineBudget(1e9, 0);
		const long = 'X:1\nL:1/8\nK:C\n"C7"' + 'C E G _B A G E C |'.repeat(4) + ']';
		const keys = KEYS;
		let probeRanAt = -1;
		let done = 0;
		const probe = new Promise<void>((resolve) =>
			setImmediate(() => {
				probeRanAt = done;
				resolve();
			})
		);
		const grid = renderLickGrid({ abc: long }, { keys, qualities: ['7', 'm7'] }).then((r) => {
			done = 1;
			return r;
		});
		await Promise.all([probe, grid]);
		expect((await grid).ok).toBe(true);
		// The probe, queued after the grid started, ran before the grid finished.
		expect(probeRanAt).toBe(0);
		configureEngineBudget();
	});
});
