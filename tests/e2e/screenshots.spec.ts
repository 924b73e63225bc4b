import { expect, test, type Page } from '@playwright/test';
import { newAccount, signInAsNew, signInAsNewAdmin, signUpViaApi } from './support/accounts';
import { gradeRevealed, nextRecall, revealAndGrade, seedDemo, signInAsDemo } from './support/drill';

/**
 * Screenshots for the README (docs/screenshots/). Run on demand, since they rewrite tracked
 * files: `SCREENSHOTS=1 npx playwright test screenshots` (the config ignores this file otherwise).
 */

const dir = 'docs/screenshots';

async function settle(page: Page) {
	await page.evaluate(() => document.fonts.ready);
	await page.waitForLoadState('networkidle');
}

test.beforeAll(() => seedDemo());

for (const view of [
	{ suffix: '', width: 1280, height: 800, scheme: 'light' as const, learner: 'alto@example.com' },
	{
		suffix: '-mobile-dark',
		width: 390,
		height: 844,
		scheme: 'dark' as const,
		learner: 'guitar@example.com'
	}
]) {
	test.describe(`at ${view.width}px in ${view.scheme}`, () => {
		test.use({ viewport: { width: view.width, height: view.height }, colorScheme: view.scheme });

		test('landing, sign-in and the try-it box', async ({ page }) => {
			await page.goto('/');
			await settle(page);
			await page.screenshot({ path: `${dir}/landing${view.suffix}.png` });

			await expect(page.getByRole('button', { name: 'Show this key' })).toBeEnabled();
			await page.getByLabel('Key', { exact: true }).selectOption('Eb');
			await page.getByRole('button', { name: 'Show this key' }).click();
			await expect(page.getByTestId('notation').locator('svg').first()).toBeVisible();
			await settle(page);
			await page.locator('#try').screenshot({ path: `${dir}/try-it${view.suffix}.png` });

			await page.goto('/sign-in');
			await settle(page);
			await page.screenshot({ path: `${dir}/sign-in${view.suffix}.png` });
		});

		test('the empty learner home', async ({ page, request }) => {
			await signInAsNew(page, request, 'learner');
			await page.goto('/home');
			await settle(page);
			await page.screenshot({
				path: `${dir}/learner-home${view.suffix}.png`,
				fullPage: view.width > 500
			});
		});

		test('the empty teacher home', async ({ page, request }) => {
			await signInAsNew(page, request, 'teacher');
			await page.goto('/teach');
			await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
			await settle(page);
			await page.screenshot({
				path: `${dir}/teacher-home${view.suffix}.png`,
				fullPage: view.width > 500
			});
		});

		test('the refusal a learner gets from a teacher page', async ({ page, request }) => {
			await signInAsNew(page, request, 'learner');
			const response = await page.goto('/teach');
			expect(response?.status()).toBe(403);
			await settle(page);
			await page.screenshot({ path: `${dir}/forbidden${view.suffix}.png` });
		});

		test('the admin outbox with a few sign-up mails', async ({ page, request }) => {
			// Two more people sign up first, so the outbox lists more than the admin's own mail.
			for (const account of [newAccount('teacher'), newAccount('learner', 'Ravi Okafor')]) {
				await signUpViaApi(request, account);
			}
			await signInAsNewAdmin(page, request);
			await page.goto('/admin/outbox');
			await expect(page.getByRole('link', { name: /Confirm your e-mail/ }).nth(2)).toBeVisible();
			await settle(page);
			await page.screenshot({ path: `${dir}/admin-outbox${view.suffix}.png` });
		});

		test('the drill: a prompt, its reveal, the summary and the progress page', async ({ page }) => {
			test.setTimeout(120_000);
			await signInAsDemo(page, view.learner);
			await page.goto('/drill');
			await page.getByRole('button', { name: 'Start the drill' }).click();
			expect(await nextRecall(page)).toBeTruthy();
			await settle(page);
			await page.screenshot({ path: `${dir}/drill-prompt${view.suffix}.png` });

			await page.keyboard.press('Space');
			await expect(page.getByTestId('notation').locator('svg').first()).toBeVisible();
			await settle(page);
			await page.screenshot({ path: `${dir}/drill-reveal${view.suffix}.png` });

			await gradeRevealed(page, 4);
			for (let i = 0; i < 30; i++) {
				if (!(await nextRecall(page))) break;
				await revealAndGrade(page, 4);
			}
			await expect(page.getByTestId('summary-streak')).toHaveText(/^\d+ days?$/);
			await settle(page);
			await page.screenshot({ path: `${dir}/drill-summary${view.suffix}.png`, fullPage: true });

			await page.goto('/progress');
			await settle(page);
			await page.screenshot({ path: `${dir}/progress${view.suffix}.png`, fullPage: true });
		});
	});
}

test.describe('the try-it box for a guitarist and a horn player', () => {
	test('guitar with tablature at desktop size', async ({ page }) => {
		await page.goto('/');
		await expect(page.getByRole('button', { name: 'Show this key' })).toBeEnabled();
		await page.getByLabel('Start from one of ours').selectOption('upstairs');
		await page.getByLabel('Instrument').selectOption('guitar');
		await page.getByLabel('Key', { exact: true }).selectOption('E');
		await page.getByRole('button', { name: 'Show this key' }).click();
		await expect(page.locator('.abcjs-tab-number').first()).toBeVisible();
		await settle(page);
		await page.locator('#try').screenshot({ path: `${dir}/try-it-guitar.png` });
	});

	test('guitar with tablature on a phone, wrapped a bar a line', async ({ page }) => {
		await page.setViewportSize({ width: 390, height: 844 });
		await page.goto('/');
		await expect(page.getByRole('button', { name: 'Show this key' })).toBeEnabled();
		await page.getByLabel('Start from one of ours').selectOption('upstairs');
		await page.getByLabel('Instrument').selectOption('guitar');
		await page.getByLabel('Key', { exact: true }).selectOption('E');
		await page.getByRole('button', { name: 'Show this key' }).click();
		await expect(page.locator('.abcjs-tab-number').first()).toBeVisible();
		await settle(page);
		await page.getByTestId('try-result').screenshot({ path: `${dir}/try-it-guitar-mobile.png` });
	});

	test('alto saxophone, written key with the concert key beside it', async ({ page }) => {
		await page.goto('/');
		await expect(page.getByRole('button', { name: 'Show this key' })).toBeEnabled();
		await page.getByLabel('Instrument').selectOption('alto-sax');
		await page.getByLabel('Key', { exact: true }).selectOption('Eb');
		await page.getByRole('button', { name: 'Show this key' }).click();
		await expect(page.getByTestId('notation').locator('svg').first()).toBeVisible();
		await settle(page);
		await page.locator('#try').screenshot({ path: `${dir}/try-it-alto.png` });
	});
});

/**
 * The two scheduled mails as a phone shows them, light and dark: the demo school seeded in a
 * folder of its own, one run of `npm run digest` on a Monday (the summary's day), and the HTML
 * parts read back from the outbox.
 */
test.describe('the scheduled mails at phone width', () => {
	test.use({ viewport: { width: 390, height: 844 } });

	test('a Daily reminder and a Weekly class summary', async ({ page }) => {
		test.setTimeout(240_000);
		const { spawnSync } = await import('node:child_process');
		const fs = await import('node:fs');
		const path = await import('node:path');
		const { simpleParser } = await import('mailparser');
		const dataDir = path.resolve('tmp/screenshots-mail');
		fs.rmSync(dataDir, { recursive: true, force: true });
		const env = { ...process.env, DATA_DIR: dataDir, SMTP_URL: '', DATABASE_URL: '' };
		for (const args of [['scripts/seed.ts'], ['scripts/digest.ts', '--now', nextMondayEvening()]]) {
			const run = spawnSync(process.execPath, ['--import', 'tsx', ...args], {
				env,
				encoding: 'utf8'
			});
			expect(run.status, run.stderr).toBe(0);
		}
		const outbox = path.join(dataDir, 'outbox');
		const mails = await Promise.all(
			fs.readdirSync(outbox).map(async (n) => simpleParser(fs.readFileSync(path.join(outbox, n))))
		);
		const reminder = mails.find((m) => m.subject?.startsWith('Today:'));
		const summary = mails.find((m) => m.subject?.startsWith('Your classes'));
		expect(reminder && summary).toBeTruthy();
		for (const [name, mail] of [
			['mail-digest', reminder!],
			['mail-summary', summary!]
		] as const) {
			for (const scheme of ['light', 'dark'] as const) {
				await page.emulateMedia({ colorScheme: scheme });
				await page.setContent(String(mail.html));
				await page.screenshot({
					path: `${dir}/${name}${scheme === 'dark' ? '-dark' : ''}.png`,
					fullPage: true
				});
			}
		}
	});
});

/** 20:00 UTC on the coming Monday: every demo person's hour has come, and it is summary day. */
function nextMondayEvening(): string {
	const d = new Date();
	d.setUTCDate(d.getUTCDate() + ((8 - d.getUTCDay()) % 7 || 7));
	d.setUTCHours(20, 0, 0, 0);
	return d.toISOString();
}
