import { expect, test } from '@playwright/test';
import {
	newAccount,
	promoteToAdmin,
	signInAsNew,
	signInAsNewAdmin,
	signInViaApi,
	signUpViaApi
} from './support/accounts';
import { linkIn, newestMailTo, newestMailWithSubject } from './support/outbox';
import { seedDemo, signInAsDemo } from './support/drill';
import { PASSWORD_RULE } from '../../src/lib/forms/account';

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

test.describe('passwords', () => {
	test('the sign-up form refuses a common password, saying why, under the same rule its hint shows', async ({
		page
	}) => {
		const learner = newAccount('learner');
		await page.goto('/sign-up');
		const field = page.getByLabel('Password');
		await expect(page.locator('#password-hint')).toHaveText(PASSWORD_RULE);
		await page.getByLabel('Your name').fill(learner.name);
		await page.getByLabel('E-mail address').fill(learner.email);
		const error = page.locator('#password-error');
		for (const [weak, why] of [
			['password12', /^Too easy to guess: it is one of the most common passwords/],
			['Twelvefold1', /^Too easy to guess: it is built on the name of this site/],
			[learner.email, /^Too easy to guess: it is your e-mail address/]
		] as const) {
			await field.fill(weak);
			await page.getByRole('button', { name: 'Create my account' }).click();
			await expect(error).toHaveText(why);
			// The refusal ends with the rule, word for word as the hint says it.
			expect((await error.textContent())?.trim().endsWith(PASSWORD_RULE)).toBe(true);
			await expect(page).toHaveURL(/\/sign-up$/);
		}
		const res = await page.request.post('/api/auth/sign-in', {
			data: { email: learner.email, password: 'password12' }
		});
		expect(res.status()).toBe(401);
	});

	test('after "Password changed" the fields are empty and the owner gets a mail about it', async ({
		page,
		request
	}) => {
		const learner = await signInAsNew(page, request, 'learner');
		await page.goto('/settings');
		await page.getByLabel('Current password').fill(learner.password);
		await page.getByLabel('New password', { exact: true }).fill('walking-bass-77');
		await page.getByLabel('The new password again').fill('walking-bass-77');
		await page.getByRole('button', { name: 'Save the new password' }).click();
		await expect(page.getByText('Password changed.')).toBeVisible();
		await expect(page.getByText(`a mail to ${learner.email} says so`)).toBeVisible();
		for (const label of ['Current password', 'The new password again']) {
			await expect(page.getByLabel(label)).toHaveValue('');
		}
		await expect(page.getByLabel('New password', { exact: true })).toHaveValue('');

		const mail = await newestMailWithSubject(learner.email, 'Your Twelvefold password was changed');
		expect(mail.text).toContain('If it was not you, someone knows your password.');
		expect(linkIn(mail, '/forgot-password').pathname).toBe('/forgot-password');
	});

	test('a reset link with a bad or spent token says so at once, with no form to fill in', async ({
		page,
		request
	}) => {
		await page.goto('/reset-password?token=' + 'x'.repeat(43));
		await expect(page.getByText('This link is not valid.')).toBeVisible();
		await expect(page.locator('input[type=password]')).toHaveCount(0);
		await expect(page.getByRole('link', { name: 'Ask for a new one' })).toBeVisible();

		// A real link works once; opened again it says it was used, before anything is typed.
		const learner = newAccount('learner');
		await signUpViaApi(request, learner);
		await request.post('/forgot-password', {
			form: { email: learner.email },
			headers: { origin: new URL(page.url()).origin }
		});
		const link = linkIn(
			await newestMailWithSubject(learner.email, 'Choose a new Twelvefold password'),
			'/reset-password'
		);
		await page.goto(link.pathname + link.search);
		await page.getByLabel('New password', { exact: true }).fill('comping-chords-9');
		await page.getByLabel('The same password again').fill('comping-chords-9');
		await page.getByRole('button', { name: 'Save the new password' }).click();
		await expect(page).toHaveURL(/\/sign-in\?reset$/);
		await newestMailWithSubject(learner.email, 'Your Twelvefold password was reset');
		await page.goto(link.pathname + link.search);
		await expect(page.getByText('This link has already been used')).toBeVisible();
		await expect(page.locator('input[type=password]')).toHaveCount(0);
	});
});

test('the forgot-password page and the reset mail give the link the lifetime the server keeps', async ({
	page,
	request
}) => {
	const learner = newAccount('learner');
	await signUpViaApi(request, learner);
	await page.goto('/forgot-password');
	await page.getByLabel('E-mail address').fill(learner.email);
	await page.getByRole('button', { name: 'Mail me a reset link' }).click();
	await expect(page.getByRole('main')).toContainText('The link works once, for 60 minutes.');
	const mail = await newestMailWithSubject(learner.email, 'Choose a new Twelvefold password');
	expect(mail.text).toContain('The link works once, for 60 minutes.');
	// The address is not confirmed yet: the mail greets no one by the name typed at sign-up.
	expect(mail.text).not.toContain(learner.name);
});

test('the sign-up page describes the drill as it works: keys picked round all twelve', async ({
	page
}) => {
	await page.goto('/sign-up');
	await expect(page.getByRole('main')).toContainText('in keys picked to cover all twelve');
	await expect(page.getByRole('main')).not.toContainText('random keys');
});

test.describe('confirming an address', () => {
	test('the mail and the page give the link the same lifetime, the one the server keeps', async ({
		page
	}) => {
		const learner = newAccount('learner', 'Visit www.prize-claim.test now');
		await page.goto('/sign-up');
		await page.getByLabel('Your name').fill(learner.name);
		await page.getByLabel('E-mail address').fill(learner.email);
		await page.getByLabel('Password').fill(learner.password);
		await page.getByRole('button', { name: 'Create my account' }).click();
		await expect(page).toHaveURL(/\/verify-email\?sent=1$/);
		await expect(page.getByRole('main')).toContainText('Open it within 24 hours');
		const mail = await newestMailTo(learner.email);
		expect(mail.text).toContain('The link works once, for 24 hours.');
		// The name typed at sign-up stays out of a mail to an address that agreed to nothing.
		expect(`${mail.subject}${mail.text}${mail.html}`).not.toContain('prize');
	});

	test('"Send the link again" says a new link went out, and to where', async ({
		page,
		request
	}) => {
		const learner = await signInAsNew(page, request, 'learner');
		await page.goto('/verify-email');
		await expect(page.getByRole('heading', { level: 1 })).toHaveText('Confirm your address');
		await expect(page.getByText('We mailed')).toHaveCount(0);
		await page.getByRole('button', { name: 'Send the link again' }).click();
		await expect(page.getByText('A new link is on its way.')).toBeVisible();
		await expect(page.getByText(`We sent it to ${learner.email}.`)).toBeVisible();
	});

	test('opened by someone signed out, the page does not claim a link was mailed', async ({
		page
	}) => {
		await page.goto('/verify-email');
		await expect(page.getByRole('heading', { level: 1 })).toHaveText('Confirm your address');
		await expect(page.getByRole('main')).not.toContainText('We mailed');
		await expect(page.getByRole('main').getByRole('link', { name: 'Sign in' })).toBeVisible();
	});
});

test.describe("each role's Today page", () => {
	test.beforeAll(() => seedDemo());

	test('a learner sees their drill and learner wording', async ({ page }) => {
		await signInAsDemo(page, 'alto@example.com');
		await page.goto('/home');
		await expect(page.getByRole('heading', { level: 1 })).toHaveText('Hello, Ines');
		await expect(page.getByRole('heading', { name: 'Your daily drill' })).toBeVisible();
		await expect(page.getByText('Licks your teacher assigns to your class')).toBeVisible();
	});

	test('a teacher sees their classes first and no learner wording', async ({ page }) => {
		await signInAsDemo(page, 'teacher@example.com');
		await page.goto('/home');
		await expect(page.getByRole('heading', { level: 1 })).toHaveText('Hello, Rosa');
		await expect(page.getByRole('heading', { name: 'Your classes' })).toBeVisible();
		await expect(page.getByTestId('home-classes').getByRole('link').first()).toBeVisible();
		await expect(page.getByRole('heading', { name: 'Your own drill', exact: true })).toBeVisible();
		const main = page.getByRole('main');
		for (const learnerWording of [
			'Your daily drill',
			'Licks your teacher assigns',
			'Add to your drill'
		]) {
			await expect(main).not.toContainText(learnerWording);
		}
	});

	test("an admin sees the site, is not greeted by the school's name, and sees no learner wording", async ({
		page
	}) => {
		await signInAsDemo(page, 'admin@example.com');
		await page.goto('/home');
		await expect(page.getByRole('heading', { level: 1 })).toHaveText('The site today');
		const main = page.getByRole('main');
		await expect(main).not.toContainText('Workshop');
		await expect(page.getByTestId('site-counts')).toContainText('Learners');
		await expect(main.getByRole('link', { name: 'The outbox' })).toHaveAttribute(
			'href',
			'/admin/outbox'
		);
		for (const learnerWording of ['Your daily drill', 'Licks your teacher assigns', 'Hello,']) {
			await expect(main).not.toContainText(learnerWording);
		}
	});

	test('the front page offers each signed-in role its own way in', async ({ page }) => {
		await signInAsDemo(page, 'teacher@example.com');
		await page.goto('/');
		await expect(page.getByRole('link', { name: 'Go to your Today page' })).toBeVisible();
		await expect(page.getByRole('link', { name: 'Go to today’s drill' })).toHaveCount(0);
	});
});
