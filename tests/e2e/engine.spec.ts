import { expect, test, type Locator, type Page } from '@playwright/test';
import { DEMO_LICKS } from '../../src/lib/demo/licks';

/**
 * What a guitarist and a horn player read in the try-it box, checked note by note against the
 * engine's own answer.
 */

/** Standard tuning, low E to high E, sounding MIDI numbers: E2 A2 D3 G3 B3 E4 (common practice). */
const OPEN_STRINGS = [40, 45, 50, 55, 59, 64];

type Variant = {
	abc: string;
	key: string;
	concertKey: string;
	writtenTonic: string;
	notes: { midi: number; pitch: string; writtenPitch: string; writtenChord: string | null }[];
};

async function openTryIt(page: Page) {
	await page.goto('/');
	await expect(page.getByRole('button', { name: 'Show this key' })).toBeEnabled();
}

/**
 * The pitch every tab number on a drawing sounds: each number sits on one line of a six-line tab
 * staff (top line the high E string); its string's open pitch plus the fret is what it sounds.
 */
async function tabPitches(notation: Locator): Promise<number[]> {
	return notation.evaluate((root, open) => {
		const staves = [...root.querySelectorAll('g.abcjs-staff')]
			.map((g) => [...g.querySelectorAll('path')].map((p) => p.getBoundingClientRect()))
			.filter((lines) => lines.length === 6)
			.map((lines) => lines.map((r) => r.top + r.height / 2).sort((a, b) => a - b));
		const numbers = [...root.querySelectorAll('.abcjs-tab-number')].map((el) => {
			const r = el.getBoundingClientRect();
			return { x: r.left + r.width / 2, y: r.top + r.height / 2, fret: Number(el.textContent) };
		});
		const placed = numbers.map((n) => {
			let best = { staff: -1, line: -1, d: Infinity };
			staves.forEach((ys, staff) =>
				ys.forEach((y, line) => {
					const d = Math.abs(y - n.y);
					if (d < best.d) best = { staff, line, d };
				})
			);
			// Lines sorted top to bottom: line 0 is the high E string (index 5 of `open`).
			return { ...n, staff: best.staff, pitch: open[5 - best.line] + n.fret };
		});
		placed.sort((a, b) => a.staff - b.staff || a.x - b.x);
		return placed.map((p) => (Number.isFinite(p.fret) ? p.pitch : -1));
	}, OPEN_STRINGS);
}

/** A tie's continuation gets its own tab number; the engine merges it: compare without repeats. */
const collapse = (xs: number[]) => xs.filter((x, i) => i === 0 || x !== xs[i - 1]);

test.describe('guitar tablature sounds the engine’s pitches', () => {
	test('for every key of every demo lick, with one request per twelve keys', async ({ page }) => {
		test.setTimeout(240_000);
		const engineCalls: string[] = [];
		page.on('request', (r) => {
			if (r.url().includes('/api/transpose')) engineCalls.push(new URL(r.url()).pathname);
		});
		await openTryIt(page);
		await page.getByLabel('Instrument').selectOption('guitar');
		for (const lick of DEMO_LICKS) {
			await page.getByLabel('Start from one of ours').selectOption(lick.slug);
			engineCalls.length = 0;
			const answer = page.waitForResponse((r) => r.url().endsWith('/api/transpose/grid'));
			await page.getByRole('button', { name: 'All twelve keys' }).click();
			const grid = (await (await answer).json()) as { variants: Variant[] };
			const cards = page.getByTestId('grid-key');
			await expect(cards).toHaveCount(12);
			expect(engineCalls).toEqual(['/api/transpose/grid']);
			for (let k = 0; k < 12; k++) {
				const notation = cards.nth(k).getByTestId('notation');
				await expect(notation.locator('.abcjs-tab-number').first()).toBeVisible();
				const drawn = await tabPitches(notation);
				expect(drawn, `${lick.slug} in ${grid.variants[k].key}: no "?" frets`).not.toContain(-1);
				expect(collapse(drawn), `${lick.slug} in ${grid.variants[k].key}`).toEqual(
					collapse(grid.variants[k].notes.map((n) => n.midi))
				);
			}
		}
	});

	test('on a phone the guitar staff wraps a bar a line, each line with its tablature', async ({
		page
	}) => {
		await page.setViewportSize({ width: 390, height: 844 });
		await openTryIt(page);
		await page.getByLabel('Start from one of ours').selectOption('upstairs');
		await page.getByLabel('Instrument').selectOption('guitar');
		await page.getByLabel('Key', { exact: true }).selectOption('E');
		const answer = page.waitForResponse((r) => r.url().endsWith('/api/transpose'));
		await page.getByRole('button', { name: 'Show this key' }).click();
		const variant = (await (await answer).json()) as Variant;
		const notation = page.getByTestId('try-result').getByTestId('notation');
		await expect(notation.locator('.abcjs-tab-number').first()).toBeVisible();
		const tabStaves = await notation.evaluate(
			(root) =>
				[...root.querySelectorAll('g.abcjs-staff')].filter(
					(g) => g.querySelectorAll('path').length === 6
				).length
		);
		expect(tabStaves).toBeGreaterThanOrEqual(2);
		expect(collapse(await tabPitches(notation))).toEqual(
			collapse(variant.notes.map((n) => n.midi))
		);
		// Numbers big enough to read on a music stand: the drawing is not shrunk below its size.
		const size = await notation
			.locator('.abcjs-tab-number')
			.first()
			.evaluate((el) => el.getBoundingClientRect().height);
		expect(size).toBeGreaterThanOrEqual(9);
	});
});

test.describe('a transposing instrument reads one pitch everywhere', () => {
	test('alto saxophone: heading, staff, chips and chord names agree on the written key', async ({
		page
	}) => {
		await openTryIt(page);
		await page.getByLabel('Instrument').selectOption('alto-sax');
		await page.getByLabel('Key', { exact: true }).selectOption('Eb');
		const answer = page.waitForResponse((r) => r.url().endsWith('/api/transpose'));
		await page.getByRole('button', { name: 'Show this key' }).click();
		const v = (await (await answer).json()) as Variant;
		// Alto saxophone reads a major sixth above concert (REFERENCES.md §4): concert Eb is written C.
		expect([v.concertKey, v.writtenTonic]).toEqual(['Eb', 'C']);
		const result = page.getByTestId('try-result');
		await expect(result.getByTestId('try-heading')).toContainText(
			/Written in C, over C7, for E-flat alto saxophone\s+·\s+sounds\s+in\s+E♭/
		);
		// The staff: K:C, the chord written C7, as the abcjs drawing shows it.
		expect(v.abc).toMatch(/^K:C$/m);
		await expect(result.getByTestId('notation').locator('.abcjs-chord').first()).toHaveText('C7');
		// The chips: grouped under the written chord, each with its written note name.
		const chips = result.getByRole('list', { name: 'Degrees over C7' }).getByRole('listitem');
		await expect(chips).toHaveCount(v.notes.length);
		const shown = await chips.evaluateAll((items) =>
			items.map((li) => li.querySelectorAll('span')[1].textContent?.trim())
		);
		const written = v.notes.map((n) =>
			n.writtenPitch
				.replace(/-?\d+$/, '')
				.replace('#', '♯')
				.replace('b', '♭')
		);
		expect(shown).toEqual(written);
		expect(v.notes.every((n) => n.writtenChord === 'C7')).toBe(true);
	});

	test('B-flat trumpet in all twelve keys: each card names its written key and the concert key', async ({
		page
	}) => {
		await openTryIt(page);
		await page.getByLabel('Instrument').selectOption('trumpet');
		await page.getByRole('button', { name: 'All twelve keys' }).click();
		const cards = page.getByTestId('grid-key');
		await expect(cards).toHaveCount(12);
		// Trumpet reads a major second above concert (REFERENCES.md §4): concert C is written D.
		await expect(cards.first()).toContainText('Written in D · sounds in C');
		await expect(cards.nth(2)).toContainText('Written in C · sounds in B♭');
	});
});
