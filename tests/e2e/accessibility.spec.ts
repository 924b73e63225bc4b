import { expect, test } from '@playwright/test';
import { newAccount, signInViaApi, signUpViaApi } from './support/accounts';
import { seriousViolations } from './support/axe';

test.describe('axe-core finds no serious or critical violation', () => {
	for (const scheme of ['light', 'dark'] as const) {
		test.describe(`in the ${scheme} theme`, () => {
			test.use({ colorScheme: scheme });

			for (const path of ['/', '/sign-in', '/sign-up']) {
				test(`on ${path}`, async ({ page }) => {
					await page.goto(path);
					expect(await seriousViolations(page)).toEqual([]);
				});
			}

			test('on the learner home', async ({ page, request }) => {
				const learner = newAccount('learner');
				await signUpViaApi(request, learner);
				await signInViaApi(page, learner);
				await page.goto('/home');
				await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
				expect(await seriousViolations(page)).toEqual([]);
			});

			test('on the teacher home', async ({ page, request }) => {
				const teacher = newAccount('teacher');
				await signUpViaApi(request, teacher);
				await signInViaApi(page, teacher);
				await page.goto('/teach');
				expect(await seriousViolations(page)).toEqual([]);
			});

			test('on the refusal a learner gets from a teacher page', async ({ page, request }) => {
				const learner = newAccount('learner');
				await signUpViaApi(request, learner);
				await signInViaApi(page, learner);
				const response = await page.goto('/teach');
				expect(response?.status()).toBe(403);
				expect(await seriousViolations(page)).toEqual([]);
			});

			test('on the try-it box with a result shown', async ({ page }) => {
				await page.goto('/');
				await expect(page.getByRole('button', { name: 'Show this key' })).toBeEnabled();
				await page.getByRole('button', { name: 'Show this key' }).click();
				await expect(page.getByTestId('try-result')).toBeVisible();
				expect(await seriousViolations(page)).toEqual([]);
			});
		});
	}
});

test.describe('keyboard alone', () => {
	test('the skip link comes first and moves focus to the content', async ({ page }) => {
		await page.goto('/');
		await page.keyboard.press('Tab');
		const skip = page.getByRole('link', { name: 'Skip to content' });
		await expect(skip).toBeFocused();
		await expect(skip).toBeVisible();
		await page.keyboard.press('Enter');
		await expect(page.locator('#main')).toBeFocused();
	});

	test('a learner tabs to Sign in, fills the form and submits with Enter', async ({
		page,
		request
	}) => {
		const learner = newAccount('learner');
		await signUpViaApi(request, learner);

		await page.goto('/');
		const signIn = page
			.getByRole('navigation', { name: 'Account' })
			.getByRole('link', { name: 'Sign in' });
		for (
			let i = 0;
			i < 10 && !(await signIn.evaluate((el) => el === document.activeElement));
			i++
		) {
			await page.keyboard.press('Tab');
		}
		await expect(signIn).toBeFocused();
		await page.keyboard.press('Enter');
		await expect(page).toHaveURL(/\/sign-in$/);

		// Tab from the top of the page to the e-mail field, counting the stops on the way.
		const email = page.getByLabel('E-mail address');
		for (let i = 0; i < 15 && !(await email.evaluate((el) => el === document.activeElement)); i++) {
			await page.keyboard.press('Tab');
		}
		await expect(email).toBeFocused();
		await page.keyboard.type(learner.email);
		await page.keyboard.press('Tab');
		await expect(page.getByLabel('Password')).toBeFocused();
		await page.keyboard.type(learner.password);
		await page.keyboard.press('Enter');
		await expect(page).toHaveURL(/\/home$/);
		await expect(page.getByRole('heading', { level: 1 })).toHaveText('Hello, Lou');
	});

	test('the theme toggle works from the keyboard and is remembered', async ({ page }) => {
		await page.goto('/');
		const toggle = page.getByRole('button', { name: 'Dark theme' });
		await toggle.focus();
		const before = await page.evaluate(() => document.documentElement.classList.contains('dark'));
		await page.keyboard.press('Enter');
		await expect(toggle).toHaveAttribute('aria-pressed', String(!before));
		await page.reload();
		expect(await page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(
			!before
		);
	});
});
