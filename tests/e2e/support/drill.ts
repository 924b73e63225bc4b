import { execFileSync } from 'node:child_process';
import { expect, type Page } from '@playwright/test';
import type { CardAnswer } from '../../../src/lib/practice/api';
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
 * Add `count` public licks (the demo's, by title) to the signed-in learner's drill: a queue of
 * that many new licks, the same whatever the hour. Answers the cards' ids.
 */
export async function addPublicLicks(page: Page, count: number): Promise<string[]> {
	const list = await page.request.get(`/api/licks?scope=public&sort=title&limit=${count}`);
	expect(list.status(), await list.text()).toBe(200);
	const { items } = (await list.json()) as { items: { id: string }[] };
	expect(items.length, 'the demo should hold enough public licks').toBe(count);
	const cardIds: string[] = [];
	for (const lick of items) {
		const res = await page.request.post('/api/cards', { data: { lickId: lick.id } });
		expect(res.status(), await res.text()).toBe(201);
		cardIds.push(...((await res.json()) as { cardIds: string[] }).cardIds);
	}
	return cardIds;
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

/**
 * Go through lessons (space ends each) until a recall prompt is up; answers its card id, or null
 * when the sitting ended first.
 */
export async function nextRecall(page: Page): Promise<string | null> {
	for (let i = 0; i < 20; i++) {
		if ((await page.getByTestId('drill').getAttribute('data-phase')) === 'done') return null;
		const { cardId, mode } = await promptNow(page);
		if (mode === 'recall') return cardId;
		await expect(page.getByTestId('notation').locator('svg').first()).toBeVisible();
		await page.keyboard.press('Space');
		await expect
			.poll(async () => {
				const phase = await page.getByTestId('drill').getAttribute('data-phase');
				if (phase === 'done') return 'moved';
				const p = page.getByTestId('prompt');
				return `${await p.getAttribute('data-card')}/${await p.getAttribute('data-mode')}`;
			})
			.not.toBe(`${cardId}/${mode}`);
	}
	throw new Error('No recall prompt within 20 lessons.');
}

/** Reveal the recall prompt on screen with the space bar and grade it with a number key. */
export async function revealAndGrade(page: Page, grade: 1 | 2 | 3 | 4): Promise<void> {
	const prompt = page.getByTestId('prompt');
	await page.keyboard.press('Space');
	await expect(prompt).toHaveAttribute('data-revealed', 'yes');
	await expect(page.getByRole('button', { name: /Nailed/ })).toBeVisible();
	const progress = await page.getByTestId('drill-progress').textContent();
	await page.keyboard.press(String(grade));
	await expect
		.poll(async () => {
			if ((await page.getByTestId('drill').getAttribute('data-phase')) === 'done') return 'done';
			return page.getByTestId('drill-progress').textContent();
		})
		.not.toBe(progress);
}
