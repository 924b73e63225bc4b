import { expect, test } from '@playwright/test';
import { newAccount, signInAsNew, signInAsNewAdmin, signUpViaApi } from './support/accounts';
import { seriousViolations } from './support/axe';
import { tabTo } from './support/keyboard';

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
				await signInAsNew(page, request, 'learner');
				await page.goto('/home');
				await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
				expect(await seriousViolations(page)).toEqual([]);
			});

			test('on the teacher home', async ({ page, request }) => {
				await signInAsNew(page, request, 'teacher');
				await page.goto('/teach');
				expect(await seriousViolations(page)).toEqual([]);
			});

			test('on the refusal a learner gets from a teacher page', async ({ page, request }) => {
				await signInAsNew(page, request, 'learner');
				const response = await page.goto('/teach');
				expect(response?.status()).toBe(403);
				expect(await seriousViolations(page)).toEqual([]);
			});

			for (const { path, heading } of [
				{ path: '/forgot-password', heading: 'Lost the changes?' },
				{ path: '/reset-password?token=bad', heading: 'Choose a new password' },
				{ path: '/verify-email?token=bad', heading: 'That link did not work' }
			]) {
				test(`on ${path}`, async ({ page }) => {
					await page.goto(path);
					await expect(page.getByRole('heading', { level: 1 })).toHaveText(heading);
					expect(await seriousViolations(page)).toEqual([]);
				});
			}

			test('on the settings of a learner', async ({ page, request }) => {
				await signInAsNew(page, request, 'learner');
				await page.goto('/settings');
				await expect(page.getByRole('heading', { level: 1 })).toHaveText('Settings');
				await expect(page.getByRole('heading', { name: 'Practice' })).toBeVisible();
				expect(await seriousViolations(page)).toEqual([]);
				// A refused practice setting shows its message beside the field.
				await page.getByLabel('Time zone').fill('Nowhere/Atlantis');
				await page.getByRole('button', { name: 'Save practice settings' }).click();
				await expect(page.getByLabel('Time zone')).toHaveAttribute('aria-invalid', 'true');
				expect(await seriousViolations(page)).toEqual([]);
				// A saved one shows the success message.
				await page.getByLabel('Time zone').fill('Europe/Berlin');
				await page.getByRole('button', { name: 'Save practice settings' }).click();
				await expect(page.getByRole('status').filter({ hasText: 'Saved' })).toBeVisible();
				expect(await seriousViolations(page)).toEqual([]);
				// A refused change shows its message beside the field.
				await page.getByLabel('Current password').fill('not-my-password-1');
				await page.getByLabel('New password', { exact: true }).fill('walking-bass-77');
				await page.getByLabel('The new password again').fill('walking-bass-77');
				await page.getByRole('button', { name: 'Save the new password' }).click();
				await expect(page.getByLabel('Current password')).toHaveAttribute('aria-invalid', 'true');
				expect(await seriousViolations(page)).toEqual([]);
				// The delete confirmation is part of the page too.
				await page.getByRole('button', { name: 'I want to delete my account' }).click();
				await expect(page.getByLabel('Type your e-mail address to confirm')).toBeVisible();
				expect(await seriousViolations(page)).toEqual([]);
			});

			test('on the admin overview, the outbox and one message', async ({ page, request }) => {
				const admin = await signInAsNewAdmin(page, request);
				await page.goto('/admin');
				await expect(page.getByRole('heading', { level: 1 })).toHaveText('Overview');
				expect(await seriousViolations(page), '/admin').toEqual([]);

				await page.goto('/admin/outbox');
				await expect(page.getByRole('heading', { level: 1 })).toHaveText('Outbox');
				expect(await seriousViolations(page), '/admin/outbox').toEqual([]);

				const row = page.getByRole('row').filter({ hasText: admin.email }).first();
				await row.getByRole('link').click();
				await expect(page).toHaveURL(/\/admin\/outbox\/[^/]+$/);
				await expect(page.getByRole('heading', { name: 'Text part' })).toBeVisible();
				expect(await seriousViolations(page), page.url()).toEqual([]);
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
		await expect(page.getByLabel('Password', { exact: true })).toBeFocused();
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

	test('an admin tabs to the outbox and opens a message with Enter', async ({ page, request }) => {
		const admin = await signInAsNewAdmin(page, request);
		await page.goto('/admin');

		await tabTo(page, page.getByRole('link', { name: 'Open the outbox' }));
		await page.keyboard.press('Enter');
		await expect(page).toHaveURL(/\/admin\/outbox$/);

		const subject = page
			.getByRole('row')
			.filter({ hasText: admin.email })
			.first()
			.getByRole('link');
		const title = (await subject.textContent())?.trim() ?? '';
		expect(title).not.toBe('');
		await tabTo(page, subject, 40);
		await page.keyboard.press('Enter');
		await expect(page).toHaveURL(/\/admin\/outbox\/[^/]+$/);
		await expect(page.getByRole('heading', { level: 1 })).toHaveText(title);
		await expect(page.getByText(admin.email).first()).toBeVisible();

		// And back to the list the same way.
		await tabTo(page, page.getByRole('link', { name: '← Outbox' }));
		await page.keyboard.press('Enter');
		await expect(page).toHaveURL(/\/admin\/outbox$/);
	});

	test('a learner changes their password on Settings with the keyboard, then signs in with it', async ({
		page,
		request
	}) => {
		const learner = await signInAsNew(page, request, 'learner');
		const newPassword = 'walking-bass-77';

		await page.goto('/settings');
		await tabTo(page, page.getByLabel('Current password'));
		await page.keyboard.type(learner.password);
		await page.keyboard.press('Tab');
		await expect(page.getByLabel('New password', { exact: true })).toBeFocused();
		await page.keyboard.type(newPassword);
		await page.keyboard.press('Tab');
		await expect(page.getByLabel('The new password again')).toBeFocused();
		await page.keyboard.type(newPassword);
		await page.keyboard.press('Tab');
		await expect(page.getByRole('button', { name: 'Save the new password' })).toBeFocused();
		await page.keyboard.press('Enter');
		await expect(page).toHaveURL(/\/settings\?changed=password$/);
		await expect(page.getByText('Password changed.')).toBeVisible();

		// A fresh browser: the old password is refused, the new one lets the learner in.
		await page.context().clearCookies();
		const old = await page.request.post('/api/auth/sign-in', {
			data: { email: learner.email, password: learner.password }
		});
		expect(old.status()).toBe(401);
		await page.goto('/sign-in');
		await tabTo(page, page.getByLabel('E-mail address'));
		await page.keyboard.type(learner.email);
		await page.keyboard.press('Tab');
		await page.keyboard.type(newPassword);
		await page.keyboard.press('Enter');
		await expect(page).toHaveURL(/\/home$/);
		await expect(page.getByRole('heading', { level: 1 })).toHaveText('Hello, Lou');
	});
});
