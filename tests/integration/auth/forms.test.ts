import { afterAll, beforeAll, beforeEach, describe, expect, test } from 'vitest';
import { isRedirect } from '@sveltejs/kit';
import { configureAuthLimits } from '../../../src/lib/server/auth/limits';
import { jobsSettled } from '../../../src/lib/server/jobs';
import { safeNext, signInUrl } from '../../../src/lib/server/auth/redirects';
import { SESSION_COOKIE_NAME } from '../../../src/lib/server/auth/session';
import { EmailToken, User } from '../../../src/lib/server/db/models/index';
import { actions as signInActions } from '../../../src/routes/(auth)/sign-in/+page.server';
import { actions as signUpActions } from '../../../src/routes/(auth)/sign-up/+page.server';
import { actions as forgotActions } from '../../../src/routes/(auth)/forgot-password/+page.server';
import { actions as resetActions } from '../../../src/routes/(auth)/reset-password/+page.server';
import { FakeCookies, fakeEvent } from '../support/fake-event';
import { toSessionUser } from '../../../src/lib/server/auth/user';
import { openTestWorld, tokenFromOutbox, type TestWorld } from '../support/world';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
});
afterAll(() => world.close());
beforeEach(() => configureAuthLimits());

type Action = (event: never) => unknown;

/** Post a urlencoded form to an action; a thrown redirect comes back as `{ redirect }`. */
async function post(
	action: Action,
	fields: Record<string, string>,
	path = '/',
	cookies = new FakeCookies(),
	address?: string
) {
	const event = fakeEvent({
		method: 'POST',
		path,
		body: new URLSearchParams(fields).toString(),
		contentType: 'application/x-www-form-urlencoded',
		cookies,
		address
	});
	const headers = event.sentHeaders;
	try {
		return { result: await action(event as never), cookies, headers };
	} catch (thrown) {
		if (isRedirect(thrown)) {
			return { redirect: thrown.location, status: thrown.status, cookies, headers };
		}
		throw thrown;
	}
}

const PASSWORD = 'walking-bass-7';

describe('where sign-in may send you next', () => {
	test.each([
		['/teach/decks?x=1', '/teach/decks?x=1'],
		['//evil.test/path', '/home'],
		['/\\evil.test', '/home'],
		['https://evil.test', '/home'],
		['javascript:alert(1)', '/home'],
		['/ok\nSet-Cookie: x', '/home'],
		['', '/home'],
		[null, '/home'],
		['/☃?key=é#top', '/%E2%98%83?key=%C3%A9#top'],
		['/teach/../admin', '/admin']
	])('safeNext(%j) is %j', (next, expected) => {
		expect(safeNext(next)).toBe(expected);
	});

	test('a next beyond Latin-1 still makes a valid Location header', () => {
		// The Fetch standard's Headers accept ByteStrings only; `/☃` raw would throw here.
		const response = new Response(null, { status: 303, headers: { location: safeNext('/☃') } });
		expect(response.headers.get('location')).toBe('/%E2%98%83');
	});

	test('the sign-in link carries the page asked for', () => {
		expect(signInUrl(new URL('http://x.test/teach/classes?tab=2'))).toBe(
			'/sign-in?next=%2Fteach%2Fclasses%3Ftab%3D2'
		);
		expect(signInUrl(new URL('http://x.test/'))).toBe('/sign-in');
	});
});

describe('the account forms', () => {
	test('sign-up creates the account, signs in and shows the check-your-mail screen', async () => {
		const done = await post(signUpActions.default, {
			name: 'Form Player',
			email: 'form1@example.test',
			password: PASSWORD,
			role: 'teacher'
		});
		expect(done).toMatchObject({ status: 303, redirect: '/verify-email?sent=1' });
		expect(done.cookies.get(SESSION_COOKIE_NAME)).toMatch(/^[A-Za-z0-9_-]{43}$/);
		expect((await User.findOne({ where: { email: 'form1@example.test' } }))?.role).toBe('teacher');
	});

	test('a refused sign-up answers 422 with the typed values but never the password', async () => {
		const done = await post(signUpActions.default, {
			name: 'Form Player',
			email: 'form2@example.test',
			password: 'brief',
			role: 'learner'
		});
		expect(done.result).toMatchObject({
			status: 422,
			data: {
				form: {
					data: { name: 'Form Player', email: 'form2@example.test', role: 'learner', password: '' },
					errors: {
						password: [expect.stringMatching(/^Too short: 5 characters\. Use at least 10/)]
					}
				}
			}
		});
		expect(JSON.stringify(done.result)).not.toContain('brief');
	});

	test('sign-in follows a safe next and ignores an unsafe one', async () => {
		await post(signUpActions.default, {
			name: 'Nexter',
			email: 'form3@example.test',
			password: PASSWORD,
			role: 'learner'
		});
		const safe = await post(signInActions.default, {
			email: 'form3@example.test',
			password: PASSWORD,
			next: '/settings'
		});
		expect(safe).toMatchObject({ status: 303, redirect: '/settings' });
		const unsafe = await post(signInActions.default, {
			email: 'form3@example.test',
			password: PASSWORD,
			next: '//evil.test'
		});
		expect(unsafe).toMatchObject({ status: 303, redirect: '/home' });
	});

	test('a wrong password answers 400 keeping the address, and the sixth try 429 with Retry-After', async () => {
		const statuses = [];
		const retryAfter = [];
		for (let i = 0; i < 6; i++) {
			const done = await post(signInActions.default, {
				email: 'form3@example.test',
				password: 'not-the-one-1'
			});
			statuses.push((done.result as { status: number }).status);
			retryAfter.push(done.headers['Retry-After']);
			if (i === 0) {
				expect(done.result).toMatchObject({
					data: {
						form: {
							data: { email: 'form3@example.test', password: '' },
							message: 'That e-mail and password do not match an account.'
						}
					}
				});
			}
		}
		expect(statuses).toEqual([400, 400, 400, 400, 400, 429]);
		// Like the API's 429: whole seconds, at most the 15-minute window.
		expect(retryAfter.slice(0, 5)).toEqual([undefined, undefined, undefined, undefined, undefined]);
		expect(Number(retryAfter[5])).toBeGreaterThan(0);
		expect(Number(retryAfter[5])).toBeLessThanOrEqual(15 * 60 + 1);
	});

	test('sign-up and reset answer 429 with Retry-After too', async () => {
		await configureAuthLimits({
			signUpAddress: { max: 1, windowMs: 60_000 },
			resetAddress: { max: 1, windowMs: 60_000 }
		});
		const signUp = () =>
			post(
				signUpActions.default,
				{ name: 'Busy', email: 'busy@example.test', password: PASSWORD, role: 'learner' },
				'/',
				new FakeCookies(),
				'192.0.2.77'
			);
		await signUp();
		const refused = await signUp();
		expect(refused.result).toMatchObject({ status: 429 });
		expect(Number(refused.headers['Retry-After'])).toBeGreaterThan(0);
		const reset = () =>
			post(
				forgotActions.default,
				{ email: 'busy@example.test' },
				'/',
				new FakeCookies(),
				'192.0.2.77'
			);
		expect(await reset()).toMatchObject({ status: 303 });
		const resetRefused = await reset();
		expect(resetRefused.result).toMatchObject({ status: 429 });
		expect(Number(resetRefused.headers['Retry-After'])).toBeGreaterThan(0);
	});

	test('sign-up forms without an e-mail share no bucket: each is refused for the address, never limited', async () => {
		await configureAuthLimits({
			signUpEmail: { max: 1, windowMs: 60_000 },
			signUpAddress: { max: 100, windowMs: 60_000 }
		});
		for (let i = 0; i < 4; i++) {
			for (const email of ['', '   ', 'not-an-address']) {
				const done = await post(
					signUpActions.default,
					{ name: 'Nobody', email, password: PASSWORD, role: 'learner' },
					'/',
					new FakeCookies(),
					`198.51.100.${i}`
				);
				expect((done.result as { status: number }).status).toBe(422);
			}
		}
	});

	test('sign-up with an address that has an account says what the reset page says, and mails a reset link', async () => {
		await post(signUpActions.default, {
			name: 'First',
			email: 'taken@example.test',
			password: PASSWORD,
			role: 'learner'
		});
		const again = await post(
			signUpActions.default,
			{ name: 'Second', email: 'Taken@Example.test', password: 'other-pass-99', role: 'learner' },
			'/',
			new FakeCookies(),
			'192.0.2.88'
		);
		expect(again).toMatchObject({ status: 303, redirect: '/sign-up?sent' });
		// Not signed in as anyone.
		expect(again.cookies.get(SESSION_COOKIE_NAME)).toBeUndefined();
		await jobsSettled();
		expect(await tokenFromOutbox('taken@example.test', '/reset-password')).toMatch(/^[\w-]{20,}$/);
		const { load } = await import('../../../src/routes/(auth)/sign-up/+page.server');
		const page = (await load(fakeEvent({ path: '/sign-up?sent' }) as never)) as { sent: boolean };
		expect(page.sent).toBe(true);
	});

	test('a body that is not a form answers 400 and changes nothing', async () => {
		const before = await User.count();
		const event = fakeEvent({
			method: 'POST',
			body: '{"name": "x"}',
			contentType: 'application/json'
		});
		const result = await signUpActions.default(event as never);
		expect(result).toMatchObject({
			status: 400,
			data: { form: { message: 'The form could not be read.' } }
		});
		expect(await User.count()).toBe(before);
	});

	test('forgot-password answers alike for known and unknown addresses; the reset form sets the password', async () => {
		const owner = await User.findOne({ where: { email: 'form3@example.test' } });
		const resetTokens = () => EmailToken.count({ where: { userId: owner!.id, purpose: 'reset' } });
		const before = await resetTokens();
		const known = await post(forgotActions.default, { email: 'form3@example.test' });
		// Answered before the account was even looked up: no token yet, so no time spent on one.
		expect(await resetTokens()).toBe(before);
		const unknown = await post(forgotActions.default, { email: 'ghost@example.test' });
		expect(known).toMatchObject({ status: 303, redirect: '/forgot-password?sent' });
		expect(unknown).toMatchObject({ status: 303, redirect: '/forgot-password?sent' });
		// The token and the mail follow the answer.
		await jobsSettled();
		expect(await resetTokens()).toBe(before + 1);

		const token = await tokenFromOutbox('form3@example.test', '/reset-password');
		const mismatch = await post(resetActions.default, {
			token,
			password: 'comping-chords-9',
			confirm: 'comping-chords-8'
		});
		expect(mismatch.result).toMatchObject({
			status: 422,
			data: { form: { errors: { confirm: ['The two passwords are not the same.'] } } }
		});
		const done = await post(resetActions.default, {
			token,
			password: 'comping-chords-9',
			confirm: 'comping-chords-9'
		});
		expect(done).toMatchObject({ status: 303, redirect: '/sign-in?reset' });
		const reused = await post(resetActions.default, {
			token,
			password: 'comping-chords-9',
			confirm: 'comping-chords-9'
		});
		expect(reused.result).toMatchObject({
			status: 400,
			data: { form: { message: 'This link has already been used or replaced by a newer one.' } }
		});
	});
});

describe('asking for a new verification link', () => {
	test('works three times an hour per account, then answers 429', async () => {
		const { actions } = await import('../../../src/routes/(auth)/verify-email/+page.server');
		const user = await User.findOne({ where: { email: 'form1@example.test' } });
		const locals = { user: toSessionUser(user!), session: null };
		const outcomes = [];
		for (let i = 0; i < 4; i++) {
			const event = fakeEvent({ method: 'POST', path: '/verify-email?/resend', locals });
			try {
				outcomes.push((await actions.resend(event as never)) as { status: number });
			} catch (thrown) {
				outcomes.push(isRedirect(thrown) ? thrown.location : thrown);
			}
		}
		// Each one answers on the page itself, naming the address, so the person sees it worked.
		const sent = { values: {}, resent: 'form1@example.test' };
		expect(outcomes.slice(0, 3)).toEqual([sent, sent, sent]);
		expect(outcomes[3]).toMatchObject({ status: 429 });
	});
});
