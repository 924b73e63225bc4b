import { expect, test } from '@playwright/test';
import {
	newAccount,
	promoteToAdmin,
	signInAsNew,
	signInAsNewAdmin,
	signInViaApi,
	signUpViaApi
} from './support/accounts';
import { linkIn, newestMailTo } from './support/outbox';

test('a learner signs up with the form, confirms the address from the mailed link, signs out and back in', async ({
	page
}) => {
	const learner = newAccount('learner');

	await page.goto('/sign-up');
	await page.getByLabel('Your name').fill(learner.name);
	await page.getByLabel('E-mail address').fill(learner.email);
	await page.getByLabel('Password').fill(learner.password);
	await page.getByRole('radio', { name: /I practise/ }).check();
	await page.getByRole('button', { name: 'Create my account' }).click();
	await expect(page).toHaveURL(/\/verify-email\?sent=1$/);

	// The app's local SMTP stand-in files the mail in DATA_DIR/outbox; follow its link.
	const mail = await newestMailTo(learner.email);
	const link = linkIn(mail, '/verify-email');
	expect(link.searchParams.get('token')).toBeTruthy();
	await page.goto(link.pathname + link.search);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(/confirmed/i);

	const nav = page.getByRole('navigation', { name: 'Main' });
	await page.goto('/home');
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(`Hello, Lou`);
	await expect(nav.getByRole('link', { name: 'Today' })).toHaveAttribute('aria-current', 'page');
	await expect(nav.getByRole('link', { name: 'Settings' })).toBeVisible();
	await expect(nav.getByRole('link', { name: 'Teaching' })).toHaveCount(0);
	await expect(nav.getByRole('link', { name: 'Outbox' })).toHaveCount(0);

	await nav.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/$/);
	await expect(page.getByRole('link', { name: 'Sign in' })).toBeVisible();
	await page.goto('/home');
	await expect(page).toHaveURL(/\/sign-in\?next=%2Fhome$/);

	await page.getByLabel('E-mail address').fill(learner.email);
	await page.getByLabel('Password').fill(learner.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/home$/);
	await expect(page.getByRole('heading', { name: 'Add to your drill' })).toBeVisible();
});

test('a learner is refused the teacher and admin pages with 403', async ({ page, request }) => {
	await signInAsNew(page, request, 'learner');

	for (const path of ['/teach', '/admin', '/admin/outbox']) {
		const response = await page.goto(path);
		expect(response?.status(), path).toBe(403);
		// Refused inside the site shell: the header's menu, a heading and the reason.
		await expect(page.getByRole('heading', { level: 1 })).toHaveText(
			'This page is not open to your account'
		);
		await expect(page.getByRole('main')).toContainText(/This page is for/);
		await expect(page.getByRole('link', { name: 'Settings' })).toBeVisible();
	}
	const api = await page.request.get('/api/admin/outbox');
	expect(api.status()).toBe(403);
});

test('a signed-out visitor is sent to sign in from every signed-in page', async ({ page }) => {
	for (const path of ['/home', '/teach', '/admin/outbox']) {
		await page.goto(path);
		await expect(page, path).toHaveURL(new RegExp(`/sign-in\\?next=${encodeURIComponent(path)}$`));
	}
});

test('a teacher sees the Teaching link and an honest empty studio', async ({ page, request }) => {
	await signInAsNew(page, request, 'teacher');

	const response = await page.goto('/teach');
	expect(response?.status()).toBe(200);
	const nav = page.getByRole('navigation', { name: 'Main' });
	await expect(nav.getByRole('link', { name: 'Teaching' })).toHaveAttribute('aria-current', 'page');
	await expect(nav.getByRole('link', { name: 'Admin' })).toHaveCount(0);
	await expect(page.getByRole('link', { name: 'Open your classes' })).toBeVisible();
	await expect(page.getByText('0 licks in your library, 0 decks')).toBeVisible();
	await expect(nav.getByRole('link', { name: 'Library' })).toBeVisible();
});

test('an admin made with the CLI reaches the outbox and sees the sign-up mail', async ({
	page,
	request
}) => {
	const person = newAccount('learner', 'Ada Quill');
	await signUpViaApi(request, person);
	promoteToAdmin(person.email);
	await signInViaApi(page, person);

	await page.goto('/home');
	const nav = page.getByRole('navigation', { name: 'Main' });
	await expect(nav.getByRole('link', { name: 'Admin', exact: true })).toBeVisible();
	await nav.getByRole('link', { name: 'Outbox' }).click();
	await expect(page).toHaveURL(/\/admin\/outbox$/);
	await expect(page.getByText(person.email).first()).toBeVisible();
});

test.describe('on a phone-sized screen', () => {
	test.use({ viewport: { width: 390, height: 844 } });

	test('the navigation folds into a Menu button that opens and closes it', async ({
		page,
		request
	}) => {
		await signInAsNew(page, request, 'teacher');
		await page.goto('/teach');

		const menu = page.getByRole('button', { name: 'Menu' });
		await expect(menu).toHaveAttribute('aria-expanded', 'false');
		await expect(page.getByRole('link', { name: 'Today' })).toBeHidden();
		await menu.click();
		await expect(menu).toHaveAttribute('aria-expanded', 'true');
		const nav = page.locator('#site-nav-narrow');
		await expect(nav.getByRole('link', { name: 'Teaching' })).toHaveAttribute(
			'aria-current',
			'page'
		);
		await nav.getByRole('link', { name: 'Today' }).click();
		await expect(page).toHaveURL(/\/home$/);
		await expect(menu).toHaveAttribute('aria-expanded', 'false');
		// Nothing sticks out sideways.
		const overflow = await page.evaluate(() => document.documentElement.scrollWidth - innerWidth);
		expect(overflow).toBeLessThanOrEqual(0);
	});

	test('the admin tables fit the screen: no control or cell needs a sideways scroll', async ({
		page,
		request
	}) => {
		await signUpViaApi(request, newAccount('teacher'));
		await signInAsNewAdmin(page, request);
		for (const path of ['/admin', '/admin/outbox']) {
			await page.goto(path);
			await expect(page.getByRole('table')).toBeVisible();
			// Every visible cell ends inside the viewport (the tables' scroll boxes hide overflow).
			const widest = await page
				.getByRole('table')
				.evaluate((table) =>
					Math.max(
						...[...table.querySelectorAll('th, td, select, button, a')]
							.filter((el) => el.getClientRects().length > 0)
							.map((el) => el.getBoundingClientRect().right)
					)
				);
			expect(widest, path).toBeLessThanOrEqual(390);
		}
		await expect(page.getByRole('link', { name: /Confirm your e-mail/ }).first()).toBeVisible();
	});
});

test('the page data sent to the browser names the user and nothing more', async ({
	page,
	request
}) => {
	const learner = await signInAsNew(page, request, 'learner');
	const res = await page.request.get('/home/__data.json');
	expect(res.status()).toBe(200);
	const text = await res.text();
	expect(text).toContain(learner.email);
	for (const secret of ['password', 'hash', 'settings', 'digestHour', 'session', 'token']) {
		expect(text, secret).not.toContain(secret);
	}
});
