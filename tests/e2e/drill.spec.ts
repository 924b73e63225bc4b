import { expect, test, type Page } from '@playwright/test';
import { signInAsNew } from './support/accounts';
import {
	addOwnDeck,
	cardOnServer,
	chooseInstrument,
	nextRecall,
	promptNow,
	revealAndGrade
} from './support/drill';

/**
 * The daily drill end to end, at phone size and on a desktop: a fresh learner writes five licks
 * into a deck and adds it (so today's queue is five new licks, whatever the hour), opens the drill,
 * learns, plays the changes, reveals, grades with every grade (keys and buttons), undoes, reloads
 * mid-sitting, grades with the network gone, sees the grades saved once it is back, finishes and
 * sees the summary. Audio cannot be heard here, so the players' state is asserted instead.
 */

/** The grade buttons of the prompt on screen. */
const gradeButton = (page: Page, name: string) =>
	page.getByTestId('prompt').getByRole('button', { name: new RegExp(`^${name}`) });

for (const view of [
	{ name: 'phone', width: 390, height: 844, instrument: 'guitar' },
	{ name: 'desktop', width: 1280, height: 800, instrument: 'trumpet' }
]) {
	test.describe(`on a ${view.name}`, () => {
		test.use({ viewport: { width: view.width, height: view.height } });

		test('a learner drills a whole sitting: every grade, undo, a reload, a dropped network, the summary', async ({
			page,
			context,
			request
		}) => {
			test.setTimeout(180_000);
			await signInAsNew(page, request, 'learner');
			await chooseInstrument(page, view.instrument);
			const added = await addOwnDeck(page, 5);
			expect(added).toHaveLength(5);

			await page.goto('/drill');
			await expect(page.getByTestId('drill')).toHaveAttribute('data-phase', 'start');
			await expect(page.getByRole('heading', { name: /^5 prompts, about/ })).toBeVisible();
			await expect(page.getByTestId('drill-counts')).toContainText('5 new to learn');
			// The practice and listening cautions come before the first note.
			const caution = page.getByRole('region', { name: 'Before you play' });
			await expect(caution).toContainText('Stop if you feel pain');
			await expect(caution).toContainText('Keep playback and headphones at a moderate level');
			await page.getByRole('button', { name: 'Start the drill' }).click();
			await expect(page.getByTestId('drill')).toHaveAttribute('data-phase', 'sitting');
			await expect(page.getByTestId('drill-progress')).toHaveText('0 of 5 done');

			// A new lick is taught first: notation and sound, no grade buttons.
			const first = await promptNow(page);
			expect(first.mode).toBe('teach');
			await expect(page.getByTestId('prompt')).toContainText('New lick: learn it');
			await expect(gradeButton(page, 'Nailed')).toHaveCount(0);
			await expect(page.getByTestId('notation').locator('svg').first()).toBeVisible();
			await expect(page.getByTestId('line-state')).toHaveAttribute('data-state', 'stopped');
			await page.getByRole('button', { name: 'Got it: test me later' }).click();
			await expect(page.getByTestId('drill-progress')).toHaveText('1 of 6 done');

			const cardId = await nextRecall(page);
			expect(cardId).toBeTruthy();
			expect(added).toContain(cardId);
			// A B♭ trumpet reads in another key than it sounds; a guitar reads in the key it sounds.
			if (view.instrument === 'trumpet') {
				await expect(page.getByTestId('prompt-key')).toContainText(/written in .+ sounds in/);
			} else {
				await expect(page.getByTestId('prompt-key')).not.toContainText('written in');
			}
			const before = (await cardOnServer(page, cardId!)).card;

			// The prompt: the changes alone, looped, at the prompt's tempo; the line stays hidden.
			await expect(page.getByTestId('notation')).toHaveCount(0);
			await expect(page.getByTestId('degrees')).toHaveCount(0);
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

			// The reveal (space bar): notation, degree labels that switch off and on, the line to play.
			await page.keyboard.press('Space');
			const prompt = page.getByTestId('prompt');
			await expect(prompt).toHaveAttribute('data-revealed', 'yes');
			await expect(page.getByTestId('notation').locator('svg').first()).toBeVisible();
			await expect(page.getByTestId('degrees')).toBeVisible();
			await page.getByLabel('Degree labels').uncheck();
			await expect(page.getByTestId('degrees')).toHaveCount(0);
			await page.getByLabel('Degree labels').check();
			await expect(page.getByTestId('degrees')).toBeVisible();
			const line = page.getByTestId('line-state');
			await expect(line).toHaveAttribute('data-mode', /^(?!changes$)/);
			await expect(line).toHaveAttribute('data-bpm', String(tempo));
			await expect(prompt.getByLabel('Volume').last()).toBeVisible();
			await expect(prompt).toContainText('keep it at a moderate level');
			await line.getByRole('button', { name: 'Play', exact: true }).click();
			await expect(line).toHaveAttribute('data-state', 'playing');
			await line.getByRole('button', { name: 'Stop' }).click();
			await expect(line).toHaveAttribute('data-state', 'stopped');
			// Each grade says when the lick comes back.
			await expect(gradeButton(page, 'Nailed')).toContainText(/back in \d+ days?/);

			// Grade 4 with its key: saved on the server with the tempo played.
			await page.keyboard.press('4');
			await expect(prompt).not.toHaveAttribute('data-card', cardId!);
			await expect(page.getByTestId('outbox-status')).toHaveText('All grades saved.');
			let server = await cardOnServer(page, cardId!);
			expect(server.reviews[0]).toMatchObject({ grade: 4, tempo, undoneAt: null });
			expect(server.card.reps).toBe(1);

			// U takes it back: the same prompt, revealed again, and the card as it was on the server.
			await page.keyboard.press('u');
			await expect(prompt).toHaveAttribute('data-card', cardId!);
			await expect(prompt).toHaveAttribute('data-revealed', 'yes');
			await expect(page.getByText('Took back “Nailed”.')).toBeVisible();
			await expect
				.poll(async () => (await cardOnServer(page, cardId!)).reviews[0].undoneAt)
				.not.toBeNull();
			server = await cardOnServer(page, cardId!);
			const { retrievability: _r, version: _v, ...restored } = server.card;
			const { retrievability: _r0, version: _v0, ...original } = before;
			expect(restored).toEqual(original);
			// Graded again, by button this time.
			await gradeButton(page, 'Nailed').click();
			await expect
				.poll(async () => (await cardOnServer(page, cardId!)).reviews.filter((r) => !r.undoneAt))
				.toHaveLength(1);
			await expect(page.getByTestId('outbox-status')).toHaveText('All grades saved.');

			// A reload mid-sitting carries on where it was, from the device.
			const here = await promptNow(page);
			const progress = await page.getByTestId('drill-progress').textContent();
			await page.reload();
			await expect(page.getByTestId('drill')).toHaveAttribute('data-phase', 'sitting');
			await expect(prompt).toHaveAttribute('data-card', here.cardId);
			await expect(prompt).toHaveAttribute('data-mode', here.mode);
			await expect(page.getByTestId('drill-progress')).toHaveText(progress!);

			// The network drops: two grades (a key and a button) wait on the device, in order.
			await context.setOffline(true);
			await expect(page.getByTestId('outbox-status')).toHaveText(
				'No connection: keep going, grades are kept on this device.'
			);
			const offline: { id: string; grade: number }[] = [];
			const solid = await nextRecall(page);
			expect(solid, 'the sitting should hold two more recalls').toBeTruthy();
			await revealAndGrade(page, 3);
			offline.push({ id: solid!, grade: 3 });
			const shaky = await nextRecall(page);
			expect(shaky, 'the sitting should hold two more recalls').toBeTruthy();
			await page.getByRole('button', { name: 'Show the line' }).click();
			await gradeButton(page, 'Shaky').click();
			offline.push({ id: shaky!, grade: 2 });
			await expect(page.getByTestId('outbox-status')).toContainText('2 changes wait');
			await expect(page.getByTestId('outbox-status')).toContainText('no connection');
			const wentBack = new Date();

			await context.setOffline(false);
			await expect(page.getByTestId('outbox-status')).toHaveText('All grades saved.', {
				timeout: 15_000
			});
			for (const { id, grade } of offline) {
				const saved = await cardOnServer(page, id);
				// Sent once, whatever retries the outbox made.
				expect(saved.reviews).toHaveLength(1);
				expect(saved.reviews[0]).toMatchObject({ grade, undoneAt: null });
				// Sent later, but recorded at the time the grade was given.
				expect(Date.parse(saved.reviews[0].reviewedAt)).toBeLessThanOrEqual(wentBack.getTime());
			}

			// Dropped: the lick comes back later in this sitting.
			const dropped = await nextRecall(page);
			expect(dropped).toBeTruthy();
			await page.keyboard.press('Space');
			await gradeButton(page, 'Dropped').click();
			await expect(page.getByTestId('outbox-status')).toHaveText('All grades saved.');

			// The rest of the sitting, to the summary; the dropped lick is asked once more.
			let droppedAgain = false;
			for (let i = 0; i < 30; i++) {
				const id = await nextRecall(page);
				if (!id) break;
				if (id === dropped) {
					droppedAgain = true;
					await expect(prompt).toContainText('Once more, from memory');
				}
				await revealAndGrade(page, 4);
			}
			expect(droppedAgain).toBe(true);
			const summary = page.getByTestId('summary');
			await expect(summary).toBeVisible();
			expect(Number(await page.getByTestId('summary-reps').textContent())).toBeGreaterThanOrEqual(
				6
			);
			await expect(summary).toContainText(/Dropped 1 · Shaky 1 · Solid 1 · Nailed \d+/);
			await expect(page.getByTestId('summary-keys')).not.toHaveText('None this time.');
			await expect(page.getByTestId('summary-streak')).toHaveText('1 day');
			await expect(summary.getByRole('img', { name: /Keys played this sitting/ })).toBeVisible();
			await expect(page.getByTestId('outbox-status')).toHaveText('All grades saved.');

			// The progress page tells the same story.
			await page.getByRole('link', { name: 'See your progress' }).click();
			await expect(page.getByTestId('streak-current')).toHaveText('1');
			await expect(page.getByRole('img', { name: 'Strength by key, last 90 days' })).toBeVisible();
		});
	});
}

test('the drill asks for a session', async ({ page }) => {
	await page.goto('/drill');
	await expect(page).toHaveURL(/\/sign-in\?next=%2Fdrill$/);
});
