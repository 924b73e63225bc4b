import { expect, test, type Page } from '@playwright/test';
import { newAccount, signInAsNew, signInAsNewAdmin, signUpViaApi } from './support/accounts';
import { nextRecall, revealAndGrade, seedDemo, signInAsDemo } from './support/drill';

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

			await page.keyboard.press('4');
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
