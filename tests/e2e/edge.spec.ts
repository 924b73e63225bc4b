import { expect, test, type Page } from '@playwright/test';
import { signInAsNew } from './support/accounts';
import { E2E_ORIGIN } from './support/env';

/**
 * The web edge against the built server: headers on every answer, where `next` may send a
 * signed-in person, form action names, origins, control characters and the error pages.
 */

/** Every Content-Security-Policy violation the page reports, as event or console message. */
async function watchViolations(page: Page): Promise<string[]> {
	const found: string[] = [];
	page.on('console', (message) => {
		const text = message.text();
		if (/^CSP |Content Security Policy|Refused to/.test(text)) found.push(text);
	});
	await page.addInitScript(() => {
		document.addEventListener('securitypolicyviolation', (e) => {
			console.error(`CSP ${e.violatedDirective} blocked ${e.blockedURI}`);
		});
	});
	return found;
}

test.describe('headers', () => {
	test('a page carries a script policy without unsafe-inline, no framing, nosniff and a referrer policy', async ({
		request
	}) => {
		const res = await request.get('/');
		const headers = res.headers();
		const csp = headers['content-security-policy'];
		expect(csp).toBeTruthy();
		const scriptSrc = csp.split(';').find((d) => d.trim().startsWith('script-src'))!;
		expect(scriptSrc).toMatch(/'nonce-[^']+'/);
		expect(scriptSrc).not.toContain('unsafe-inline');
		expect(csp).toContain("frame-ancestors 'none'");
		expect(headers['x-content-type-options']).toBe('nosniff');
		expect(headers['referrer-policy']).toBe('same-origin');
		expect(headers['x-frame-options']).toBe('DENY');
		// Nothing is signed in: a public page may be cached.
		expect(headers['cache-control'] ?? '').not.toContain('no-store');
	});

	test('JSON answers and refusals carry the headers too', async ({ request }) => {
		for (const res of [
			await request.get('/api/me'),
			await request.post('/api/auth/sign-in', { data: { email: 'x@example.test' } })
		]) {
			const headers = res.headers();
			expect(headers['x-content-type-options']).toBe('nosniff');
			expect(headers['content-security-policy']).toContain("frame-ancestors 'none'");
		}
	});

	test('signed-in pages and the session answer are never stored', async ({ page, request }) => {
		await signInAsNew(page, request, 'learner');
		for (const path of ['/home', '/settings', '/api/me']) {
			const res = await page.request.get(path);
			expect(res.status(), path).toBe(200);
			expect(res.headers()['cache-control'], path).toBe('no-store');
		}
	});

	test('the try-it box draws and plays without any policy violation', async ({ page }) => {
		const violations = await watchViolations(page);
		await page.goto('/');
		await expect(page.getByRole('button', { name: 'Show this key' })).toBeEnabled();
		// The theme was set by the inline script in app.html, which the policy allows by hash.
		await page.getByRole('button', { name: 'Show this key' }).click();
		const result = page.getByTestId('try-result');
		await expect(result.getByTestId('notation').locator('svg').first()).toBeVisible();
		await result.getByRole('button', { name: 'Play' }).click();
		await expect(result.getByRole('button', { name: 'Stop' })).toBeVisible();
		await page.waitForTimeout(500);
		await result.getByRole('button', { name: 'Stop' }).click();
		await page.getByRole('button', { name: 'Dark theme' }).click();
		await page.reload();
		await expect(page.locator('html')).toHaveClass(/dark/);
		expect(violations).toEqual([]);
	});
});

test.describe('where sign-in sends a signed-in person next', () => {
	const variants = [
		'//evil.test',
		'/.//evil.test',
		'/..//evil.test',
		'/%2e//evil.test',
		'/%2E%2E//evil.test',
		'/./\\evil.test',
		'/\\evil.test',
		'https://evil.test/'
	];

	test('every spelling of another host goes home instead', async ({ page, request }) => {
		await signInAsNew(page, request, 'learner');
		for (const next of variants) {
			const res = await page.request.get(`/sign-in?next=${encodeURIComponent(next)}`, {
				maxRedirects: 0
			});
			expect(res.status(), next).toBe(303);
			expect(res.headers()['location'], next).toBe('/home');
		}
		const ok = await page.request.get(`/sign-in?next=${encodeURIComponent('/settings?x=1')}`, {
			maxRedirects: 0
		});
		expect(ok.headers()['location']).toBe('/settings?x=1');
		// A tab would be dropped by a browser's URL parser (`/\t/x` reads as `//x`): refused.
		const tab = await page.request.get('/sign-in?next=/%09/evil.test', { maxRedirects: 0 });
		expect(tab.status()).toBe(400);
	});

	test("the sign-in form's next field is held to the same rule", async ({ page, request }) => {
		const account = await signInAsNew(page, request, 'learner');
		for (const next of variants) {
			const res = await request.post('/sign-in', {
				form: { email: account.email, password: account.password, next },
				// As a browser without JavaScript posts it (with `*/*`, Kit answers an action result).
				headers: { origin: E2E_ORIGIN, accept: 'text/html' },
				maxRedirects: 0
			});
			expect(res.status(), next).toBe(303);
			expect(res.headers()['location'], next).toBe('/home');
		}
	});
});

test.describe('form action names', () => {
	const names = [
		'__proto__',
		'constructor',
		'hasOwnProperty',
		'valueOf',
		'toString',
		'isPrototypeOf',
		'__defineGetter__',
		'default',
		'',
		'nothing-here'
	];

	test('a name that is not one of the page’s own actions answers 404 on every page', async ({
		request
	}) => {
		for (const path of ['/sign-in', '/sign-up', '/forgot-password', '/reset-password']) {
			for (const name of names) {
				const res = await request.post(`${path}?/${name}`, {
					form: { email: 'x@example.test' },
					headers: { origin: E2E_ORIGIN }
				});
				expect(res.status(), `${path}?/${name}`).toBe(404);
			}
		}
	});

	test('an enhanced form gets the refusal as an action result', async ({ request }) => {
		const res = await request.post('/sign-in?/constructor', {
			form: { email: 'x@example.test' },
			headers: { origin: E2E_ORIGIN, 'x-sveltekit-action': 'true', accept: 'application/json' }
		});
		expect(res.status()).toBe(404);
		expect(await res.json()).toMatchObject({ type: 'error', error: { message: /no form action/ } });
	});
});

test.describe('origins and control characters', () => {
	test('sign-out over the API from another origin is refused and the session lives on', async ({
		page,
		request
	}) => {
		await signInAsNew(page, request, 'learner');
		const res = await page.request.post('/api/auth/sign-out', {
			headers: { origin: 'http://evil.test' }
		});
		expect(res.status()).toBe(403);
		expect(await res.json()).toEqual({
			error: { message: 'Requests that change something must come from this site.' }
		});
		expect((await page.request.get('/api/me')).status()).toBe(200);
	});

	test('a NUL in an e-mail is refused with 422 by the forms and the API alike', async ({
		request
	}) => {
		const api = await request.post('/api/auth/sign-in', {
			data: { email: 'a\u0000@example.test', password: 'x' }
		});
		expect(api.status()).toBe(422);
		expect(await api.json()).toMatchObject({ error: { field: 'email' } });
		for (const path of ['/sign-in', '/sign-up', '/forgot-password']) {
			const res = await request.post(path, {
				form: { email: 'a\u0000@example.test', password: 'x', name: 'x' },
				headers: { origin: E2E_ORIGIN }
			});
			expect(res.status(), path).toBe(422);
			expect(await res.text(), path).toContain('control character');
		}
	});
});

test.describe('screens at the edge', () => {
	test('a learner refused a teacher page sees the site shell, a way back and no sign-in offer', async ({
		page,
		request
	}) => {
		const icons: number[] = [];
		page.on('response', (res) => {
			if (res.url().includes('favicon')) icons.push(res.status());
		});
		await signInAsNew(page, request, 'learner');
		const response = await page.goto('/teach');
		expect(response?.status()).toBe(403);
		expect(response?.headers()['cache-control']).toBe('no-store');
		await expect(page.getByRole('heading', { level: 1 })).toHaveText(
			'This page is not open to your account'
		);
		await expect(page.getByRole('banner')).toBeVisible();
		await expect(page.getByRole('link', { name: 'To today' })).toHaveAttribute('href', '/home');
		await expect(page.getByRole('link', { name: 'Sign in' })).toHaveCount(0);
		const ico = await request.get('/favicon.ico');
		expect(ico.status()).toBe(200);
		expect(icons.every((status) => status === 200)).toBe(true);
	});

	test('GET /sign-out asks before signing out, and sends a visitor to the front page', async ({
		page,
		request
	}) => {
		const anonymous = await request.get('/sign-out', { maxRedirects: 0 });
		expect(anonymous.status()).toBe(303);
		expect(anonymous.headers()['location']).toBe('/');
		await signInAsNew(page, request, 'learner');
		await page.goto('/sign-out');
		await expect(page.getByRole('heading', { level: 1 })).toHaveText('Sign out?');
		await page.getByRole('main').getByRole('button', { name: 'Sign out' }).click();
		await expect(page).toHaveURL(/\/$/);
		expect((await page.request.get('/api/me')).status()).toBe(401);
	});

	test('the try-it box answers an empty lick in words for a musician', async ({ page }) => {
		const res = await page.request.post('/api/transpose', { data: { abc: '  ' } });
		expect(res.status()).toBe(400);
		const { error } = await res.json();
		expect(error.message).toMatch(/^There is no lick to play yet\. Write it in abc notation/);
		expect(error.message).not.toMatch(/string|non-empty|“abc”/);
	});

	test('the chosen role card is the filled one in the dark theme', async ({ page }) => {
		await page.emulateMedia({ colorScheme: 'dark' });
		await page.goto('/sign-up');
		const radios = page.getByRole('radio');
		await radios.last().check();
		const fill = (i: number) =>
			radios.nth(i).evaluate((el) => getComputedStyle(el).backgroundColor);
		const chosen = await fill(1);
		const other = await fill(0);
		expect(chosen).not.toBe(other);
		expect(other).toMatch(/rgba\(0, 0, 0, 0\)|transparent/);
	});
});
