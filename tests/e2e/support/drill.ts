import { execFileSync } from 'node:child_process';
import { expect, type Page } from '@playwright/test';
import type { CardAnswer } from '../../../src/lib/practice/api';
import { DEMO_LICKS } from '../../../src/lib/demo/licks';
import { E2E_DATA_DIR } from './env';

/** The demo school (accounts, licks, decks, learners' cards) seeded into the server's data folder. */
export function seedDemo(): void {
	execFileSync(process.execPath, ['--import', 'tsx', 'scripts/seed.ts'], {
		env: { ...process.env, DATA_DIR: E2E_DATA_DIR, DEMO_PASSWORD: 'demo-password-12' },
		stdio: 'pipe'
	});
}

/** Sign a seeded demo learner in (password as in playwright.config.ts). */
export async function signInAsDemo(page: Page, email: string): Promise<void> {
	const res = await page.request.post('/api/auth/sign-in', {
		data: { email, password: 'demo-password-12' }
	});
	expect(res.status(), await res.text()).toBe(200);
}

/** Pick the signed-in learner's instrument on the settings page (its id, e.g. `trumpet`). */
export async function chooseInstrument(page: Page, instrument: string): Promise<void> {
	await page.goto('/settings');
	const practice = page.getByRole('region', { name: 'Practice' });
	await practice.getByLabel('Instrument').selectOption(instrument);
	await practice.getByRole('button', { name: 'Save practice settings' }).click();
	await expect(page).toHaveURL(/\/settings\?changed=practice$/);
}

/**
 * Give the signed-in learner `count` licks of their own (the demo's lines, written by us), in a
 * deck added to their drill: a queue of that many new licks, the same whatever the hour.
 * Answers the cards' ids.
 */
export async function addOwnDeck(page: Page, count: number): Promise<string[]> {
	const lickIds: string[] = [];
	for (const demo of DEMO_LICKS.slice(0, count)) {
		const res = await page.request.post('/api/licks', {
			data: { title: demo.title, abc: demo.abc, note: demo.note }
		});
		expect(res.status(), await res.text()).toBe(201);
		lickIds.push(((await res.json()) as { id: string }).id);
	}
	expect(lickIds).toHaveLength(count);
	const deck = await page.request.post('/api/decks', {
		data: { name: 'Tonight’s lines', lickIds }
	});
	expect(deck.status(), await deck.text()).toBe(201);
	const deckId = ((await deck.json()) as { id: string }).id;
	const cards = await page.request.post('/api/cards', { data: { deckId } });
	expect(cards.status(), await cards.text()).toBe(201);
	return ((await cards.json()) as { cardIds: string[] }).cardIds;
}

/** The card as the server has it, with its review history (newest first). */
export async function cardOnServer(page: Page, cardId: string): Promise<CardAnswer> {
	const res = await page.request.get(`/api/cards/${cardId}`);
	expect(res.status(), await res.text()).toBe(200);
	return (await res.json()) as CardAnswer;
}

/** The prompt on screen: its card, and whether it is a lesson or a recall. */
export async function promptNow(page: Page): Promise<{ cardId: string; mode: string }> {
	const prompt = page.getByTestId('prompt');
	await expect(prompt).toBeVisible();
	return {
		cardId: (await prompt.getAttribute('data-card')) ?? '',
		mode: (await prompt.getAttribute('data-mode')) ?? ''
	};
}

/** The prompt on screen as `card/mode`, or `done` once the sitting has ended (read in one go). */
function promptPlace(page: Page): Promise<string> {
	return page.evaluate(() => {
		if (document.querySelector('[data-testid="drill"]')?.getAttribute('data-phase') === 'done') {
			return 'done';
		}
		const p = document.querySelector('[data-testid="prompt"]');
		return p ? `${p.getAttribute('data-card')}/${p.getAttribute('data-mode')}` : '';
	});
}

/**
 * Go through lessons (space ends each) until a recall prompt is up; answers its card id, or null
 * when the sitting ended first.
 */
export async function nextRecall(page: Page): Promise<string | null> {
	for (let i = 0; i < 20; i++) {
		await expect.poll(() => promptPlace(page)).not.toBe('');
		const place = await promptPlace(page);
		if (place === 'done') return null;
		const [cardId, mode] = place.split('/');
		if (mode === 'recall') return cardId;
		await expect(page.getByTestId('notation').locator('svg').first()).toBeVisible();
		await page.keyboard.press('Space');
		await expect.poll(() => promptPlace(page)).not.toBe(place);
	}
	throw new Error('No recall prompt within 20 lessons.');
}

/**
 * Where the sitting is, read in one go: `done` once it has ended, else the progress line (read
 * apart, the line could vanish between the two reads and leave a locator waiting for it).
 */
function sittingPlace(page: Page): Promise<string> {
	return page.evaluate(() => {
		const drill = document.querySelector('[data-testid="drill"]');
		if (drill?.getAttribute('data-phase') === 'done') return 'done';
		return document.querySelector('[data-testid="drill-progress"]')?.textContent ?? '';
	});
}

/** Reveal the recall prompt on screen with the space bar and grade it with a number key. */
export async function revealAndGrade(page: Page, grade: 1 | 2 | 3 | 4): Promise<void> {
	await page.keyboard.press('Space');
	// A prompt that has only just come up may still be swapped for the server's version of the
	// same lick, hidden again; a learner then presses once more, and so does this helper.
	const nailed = page.getByRole('button', { name: /Nailed/ });
	await expect(async () => {
		if (!(await nailed.isVisible())) await page.keyboard.press('Space');
		await expect(nailed).toBeVisible({ timeout: 1000 });
	}).toPass({ timeout: 10_000 });
	await gradeRevealed(page, grade);
}

/** Grade the revealed prompt with a number key and wait until the sitting has moved on. */
export async function gradeRevealed(page: Page, grade: 1 | 2 | 3 | 4): Promise<void> {
	await expect(page.getByTestId('prompt')).toHaveAttribute('data-revealed', 'yes');
	// The same swap can come between the reveal and here (a loaded machine answers late): the
	// line is revealed once more, as a learner would.
	const nailed = page.getByRole('button', { name: /Nailed/ });
	await expect(async () => {
		if (!(await nailed.isVisible())) await page.keyboard.press('Space');
		await expect(nailed).toBeVisible({ timeout: 1000 });
	}).toPass({ timeout: 10_000 });
	const before = await sittingPlace(page);
	await page.keyboard.press(String(grade));
	await expect.poll(() => sittingPlace(page)).not.toBe(before);
	// The next prompt comes up with its line hidden, from the first frame it is on screen.
	const shown = await page.evaluate(() => {
		const drill = document.querySelector('[data-testid="drill"]');
		if (drill?.getAttribute('data-phase') === 'done') return 'done';
		// No prompt at all: the last one was graded and the summary is on its way.
		return (
			document.querySelector('[data-testid="prompt"]')?.getAttribute('data-revealed') ?? 'done'
		);
	});
	expect(shown === 'done' || shown === 'no', `the next prompt was shown revealed`).toBe(true);
}
