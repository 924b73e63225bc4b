import { expect, test } from '@playwright/test';
import { newAccount, signUpViaApi } from './support/accounts';
import { linkIn, newestMailTo } from './support/outbox';

const SENT = 'If an account uses that address, a mail with a link is coming.';

test('the reset form says the same for an address with an account and one without; the mail follows the answer', async ({
	page
}) => {
	const learner = newAccount('learner');
	await signUpViaApi(page.request, learner);
	for (const email of [`nobody-${Date.now()}@example.test`, learner.email]) {
		await page.goto('/forgot-password');
		await page.getByLabel('E-mail address').fill(email);
		await page.getByRole('button', { name: 'Mail me a reset link' }).click();
		await expect(page.getByRole('status').filter({ hasText: SENT })).toBeVisible();
	}
	// The newest mail to the learner becomes the reset mail once the queued job has sent it.
	await expect
		.poll(async () => (await newestMailTo(learner.email)).subject, { timeout: 15_000 })
		.toMatch(/password/i);
	const mail = await newestMailTo(learner.email);
	expect(linkIn(mail, '/reset-password').searchParams.get('token')).toBeTruthy();
});

test('signing up with an address that has an account says what the reset page says, and the mailed link lets the owner in', async ({
	page
}) => {
	const owner = newAccount('learner');
	await signUpViaApi(page.request, owner);

	await page.goto('/sign-up');
	await page.getByLabel('Your name').fill('Someone Else');
	await page.getByLabel('E-mail address').fill(owner.email);
	await page.getByLabel('Password').fill('another-tune-88');
	await page.getByRole('radio', { name: /I practise/ }).check();
	await page.getByRole('button', { name: 'Create my account' }).click();
	await expect(page).toHaveURL(/\/sign-up\?sent$/);
	await expect(page.getByRole('status').filter({ hasText: SENT })).toBeVisible();
	await expect(page.getByText(/already exists/)).toHaveCount(0);

	await expect
		.poll(async () => (await newestMailTo(owner.email)).subject, { timeout: 15_000 })
		.toMatch(/password/i);
	const link = linkIn(await newestMailTo(owner.email), '/reset-password');
	await page.goto(link.pathname + link.search);
	await page.getByLabel('New password', { exact: true }).fill('fresh-changes-77');
	await page.getByLabel('The same password again').fill('fresh-changes-77');
	await page.getByRole('button', { name: /password/i }).click();
	await expect(page).toHaveURL(/\/sign-in\?reset$/);
	await page.getByLabel('E-mail address').fill(owner.email);
	await page.getByLabel('Password').fill('fresh-changes-77');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/home$/);
});
