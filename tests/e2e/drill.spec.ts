import { expect, test } from '@playwright/test';
import {
	cardOnServer,
	nextRecall,
	promptNow,
	revealAndGrade,
	seedDemo,
	signInAsDemo
} from './support/drill';

/**
 * The daily drill end to end, at phone size and on a desktop: a demo learner opens the drill,
 * plays the changes, reveals, grades with the keyboard, undoes, grades two more with the network
 * gone, sees them saved once it is back, finishes and sees the summary. Audio cannot be heard
 * here, so the player's state is asserted instead.
 */

test.beforeAll(() => seedDemo());

for (const view of [
	{ name: 'phone', width: 390, height: 844, learner: 'guitar@example.com' },
	{ name: 'desktop', width: 1280, height: 800, learner: 'trumpet@example.com' }
]) {
	test.describe(`on a ${view.name}`, () => {
		test.use({ viewport: { width: view.width, height: view.height } });

		// The demo's simulated history is seeded relative to the hour it runs, so how many recalls
		// today's queue holds for a demo learner depends on the hour: this sitting needs at least
		// three, and is skipped until it drills a learner whose queue is built for the test.
		test.fixme('a demo learner drills a sitting through undo and a dropped network to the summary', async ({
			page,
			context
		}) => {
			test.setTimeout(120_000);
			await signInAsDemo(page, view.learner);
			await page.goto('/drill');
			await expect(page.getByTestId('drill')).toHaveAttribute('data-phase', 'start');
			await expect(page.getByRole('heading', { name: 'Before you play' })).toBeVisible();
			await page.getByRole('button', { name: 'Start the drill' }).click();
			await expect(page.getByTestId('drill')).toHaveAttribute('data-phase', 'sitting');

			// A new lick is taught first: notation and sound, no grade buttons.
			const first = await promptNow(page);
			expect(first.mode).toBe('teach');
			await expect(page.getByRole('button', { name: /Nailed/ })).toHaveCount(0);
			await expect(page.getByTestId('notation').locator('svg').first()).toBeVisible();

			const cardId = await nextRecall(page);
			expect(cardId).toBeTruthy();
			// A B♭ trumpet reads in another key than it sounds; a guitar reads in the key it sounds.
			if (view.learner.startsWith('trumpet')) {
				await expect(page.getByTestId('prompt-key')).toContainText(/written in .+ sounds in/);
			} else {
				await expect(page.getByTestId('prompt-key')).not.toContainText('written in');
			}
			const before = (await cardOnServer(page, cardId!)).card;

			// The changes alone, looped, at the prompt's tempo.
			const changes = page.getByTestId('changes-state');
			await expect(changes).toHaveAttribute('data-mode', 'changes');
			await expect(changes).toHaveAttribute('data-loop', 'on');
			await page.getByRole('button', { name: 'Faster by 4 bpm' }).click();
			const tempo = Number(await page.getByLabel('Tempo', { exact: true }).inputValue());
			await expect(changes).toHaveAttribute('data-bpm', String(tempo));
			await page.getByRole('button', { name: 'Play the changes' }).click();
			await expect(changes).toHaveAttribute('data-state', 'playing');
			await page.getByRole('button', { name: 'Stop' }).click();
			await expect(changes).toHaveAttribute('data-state', 'stopped');

			// Reveal with the space bar, grade with a number key: saved on the server.
			await revealAndGrade(page, 4);
			await expect(page.getByTestId('outbox-status')).toHaveText('All grades saved.');
			let server = await cardOnServer(page, cardId!);
			expect(server.reviews[0]).toMatchObject({ grade: 4, tempo, undoneAt: null });
			expect(server.card.reps).toBe(1);

			// U takes it back: the same prompt, revealed again, and the card as it was on the server.
			await page.keyboard.press('u');
			await expect(page.getByTestId('prompt')).toHaveAttribute('data-card', cardId!);
			await expect(page.getByTestId('prompt')).toHaveAttribute('data-revealed', 'yes');
			await expect(page.getByText('Took back “Nailed”.')).toBeVisible();
			await expect
				.poll(async () => (await cardOnServer(page, cardId!)).reviews[0].undoneAt)
				.not.toBeNull();
			server = await cardOnServer(page, cardId!);
			const { retrievability: _r, version: _v, ...restored } = server.card;
			const { retrievability: _r0, version: _v0, ...original } = before;
			expect(restored).toEqual(original);
			await page.keyboard.press('4');
			await expect
				.poll(async () => (await cardOnServer(page, cardId!)).reviews.filter((r) => !r.undoneAt))
				.toHaveLength(1);

			// The network drops: two more grades wait on the device, in order.
			await expect(page.getByTestId('outbox-status')).toHaveText('All grades saved.');
			await context.setOffline(true);
			const offline: string[] = [];
			for (let i = 0; i < 2; i++) {
				const id = await nextRecall(page);
				expect(id, 'the sitting should hold two more recalls').toBeTruthy();
				offline.push(id!);
				await revealAndGrade(page, 4);
			}
			await expect(page.getByTestId('outbox-status')).toContainText('2 changes wait');
			await expect(page.getByTestId('outbox-status')).toContainText('no connection');
			const wentBack = new Date();

			await context.setOffline(false);
			await expect(page.getByTestId('outbox-status')).toHaveText('All grades saved.', {
				timeout: 15_000
			});
			for (const id of offline) {
				const saved = await cardOnServer(page, id);
				expect(saved.reviews).toHaveLength(1);
				expect(saved.reviews[0]).toMatchObject({ grade: 4, undoneAt: null });
				// Sent later, but recorded at the time the grade was given.
				expect(Date.parse(saved.reviews[0].reviewedAt)).toBeLessThanOrEqual(wentBack.getTime());
			}

			// The rest of the sitting, to the summary.
			for (let i = 0; i < 30; i++) {
				const id = await nextRecall(page);
				if (!id) break;
				await revealAndGrade(page, 4);
			}
			const summary = page.getByTestId('summary');
			await expect(summary).toBeVisible();
			expect(Number(await page.getByTestId('summary-reps').textContent())).toBeGreaterThanOrEqual(
				3
			);
			await expect(page.getByTestId('summary-keys')).not.toHaveText('None this time.');
			await expect(page.getByTestId('summary-streak')).toHaveText(/^\d+ days?$/);
			await expect(summary.getByRole('img', { name: /Keys played this sitting/ })).toBeVisible();

			// The progress page tells the same story.
			await page.getByRole('link', { name: 'See your progress' }).click();
			await expect(page.getByTestId('streak-current')).not.toHaveText('0');
			await expect(page.getByRole('img', { name: 'Strength by key, last 90 days' })).toBeVisible();
		});
	});
}

test('the drill asks for a session', async ({ page }) => {
	await page.goto('/drill');
	await expect(page).toHaveURL(/\/sign-in\?next=%2Fdrill$/);
});
