import { afterAll, beforeAll, beforeEach, describe, expect, test, vi } from 'vitest';
import { isHttpError, isRedirect } from '@sveltejs/kit';
import { configureAuthLimits } from '../../../src/lib/server/auth/limits';
import { SESSION_COOKIE_NAME } from '../../../src/lib/server/auth/session';
import { User } from '../../../src/lib/server/db/models/index';
import { handleError, handleRoleGate, handleSession } from '../../../src/hooks.server';
import { POST as signUpPost } from '../../../src/routes/api/auth/sign-up/+server';
import { POST as signInPost } from '../../../src/routes/api/auth/sign-in/+server';
import { POST as signOutPost } from '../../../src/routes/api/auth/sign-out/+server';
import { GET as meGet } from '../../../src/routes/api/me/+server';
import { FakeCookies, fakeEvent, type FakeEventInput } from '../support/fake-event';
import { openTestWorld, tokenFromOutbox, type TestWorld } from '../support/world';
import { verifyEmail, makeAdmin } from '../../../src/lib/server/auth/accounts';
import { hashPassword } from '../../../src/lib/server/auth/password';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
});
afterAll(() => world.close());
beforeEach(() => configureAuthLimits());

type Handler = (event: never) => Response | Promise<Response>;

/**
 * Run a request through the real hooks (session, then role gate, as `handle` sequences them)
 * and then the endpoint. Kit's `sequence` needs its internal request store, so the two handles
 * are chained here by hand.
 */
async function call(handler: Handler, input: FakeEventInput): Promise<Response> {
	const event = fakeEvent(input);
	try {
		return await handleSession({
			event: event as never,
			resolve: (e) =>
				handleRoleGate({ event: e, resolve: (e2) => Promise.resolve(handler(e2 as never)) })
		});
	} catch (thrown) {
		if (isRedirect(thrown)) {
			return new Response(null, { status: thrown.status, headers: { location: thrown.location } });
		}
		if (isHttpError(thrown)) return Response.json(thrown.body, { status: thrown.status });
		throw thrown;
	}
}

const PASSWORD = 'walking-bass-7';
let n = 0;
function address(): string {
	n += 1;
	return `api${n}@example.test`;
}

async function signUpAndIn(role: 'learner' | 'teacher' = 'learner') {
	const email = address();
	const up = await call(signUpPost, {
		method: 'POST',
		routeId: '/api/auth/sign-up',
		body: { email, password: PASSWORD, name: 'Api Player', role }
	});
	expect(up.status).toBe(201);
	const cookies = new FakeCookies();
	const res = await call(signInPost, {
		method: 'POST',
		routeId: '/api/auth/sign-in',
		body: { email, password: PASSWORD },
		cookies
	});
	expect(res.status).toBe(200);
	return { email, cookies };
}

describe('POST /api/auth/sign-up', () => {
	test('answers 201 with the new user and leaves a verification mail whose link works', async () => {
		const email = address();
		const res = await call(signUpPost, {
			method: 'POST',
			routeId: '/api/auth/sign-up',
			body: { email, password: PASSWORD, name: 'Lee', role: 'teacher' }
		});
		expect(res.status).toBe(201);
		expect(await res.json()).toEqual({
			user: { id: expect.any(String), name: 'Lee', email, role: 'teacher', emailVerified: false },
			mailSent: true
		});
		const token = await tokenFromOutbox(email, '/verify-email');
		expect(await verifyEmail(token)).toMatchObject({ ok: true, already: false });
	});

	test('answers 409 when the address is taken', async () => {
		const { email } = await signUpAndIn();
		const res = await call(signUpPost, {
			method: 'POST',
			routeId: '/api/auth/sign-up',
			body: { email, password: PASSWORD, name: 'Again', role: 'learner' }
		});
		expect(res.status).toBe(409);
		expect(await res.json()).toMatchObject({ error: { field: 'email' } });
	});

	test.each([
		[{ email: 'no-at-sign', password: PASSWORD, name: 'A', role: 'learner' }, 422, 'email'],
		[{ email: 'w@example.test', password: 'weak', name: 'A', role: 'learner' }, 422, 'password'],
		[{ email: 'w@example.test', password: PASSWORD, name: 'A', role: 'admin' }, 422, 'role'],
		[{ email: 'w@example.test', password: PASSWORD, name: 17, role: 'learner' }, 422, 'name'],
		// The e-mail is checked first, before the limiter: a missing one must not fill a shared bucket.
		[{ email: null, password: null, name: null, role: null }, 422, 'email']
	])('answers 422 naming the field for %j', async (body, status, field) => {
		const before = await User.count();
		const res = await call(signUpPost, { method: 'POST', routeId: '/api/auth/sign-up', body });
		expect(res.status).toBe(status);
		expect(await res.json()).toMatchObject({ error: { field, message: expect.any(String) } });
		expect(await User.count()).toBe(before);
	});

	test.each([
		['password12', /one of the most common passwords/],
		['qwerty1234', /common passwords|keyboard pattern/],
		['Twelvefold1', /the name of this site/],
		['weak-one@example.test', /your e-mail address/]
	])('refuses the weak password %j with 422 saying why', async (password, why) => {
		const before = await User.count();
		const res = await call(signUpPost, {
			method: 'POST',
			routeId: '/api/auth/sign-up',
			body: { email: 'weak-one@example.test', password, name: 'Weak One', role: 'learner' }
		});
		expect(res.status).toBe(422);
		const body = await res.json();
		expect(body).toMatchObject({ error: { field: 'password' } });
		expect(body.error.message).toMatch(why);
		expect(await User.count()).toBe(before);
	});

	test.each([
		['{"email": ', 'application/json', 400],
		['[1, 2]', 'application/json', 400],
		['null', 'application/json', 400],
		['"just a string"', 'application/json', 400],
		['', 'application/json', 400],
		['email=a@b.test', 'text/plain', 415],
		['{}', null, 415],
		[JSON.stringify({ name: 'x'.repeat(20_000) }), 'application/json', 413]
	])('malformed body %# answers a 4xx with a message, never a 500', async (body, type, status) => {
		const res = await call(signUpPost, {
			method: 'POST',
			routeId: '/api/auth/sign-up',
			body,
			contentType: type
		});
		expect(res.status).toBe(status);
		expect((await res.json()).error.message).toEqual(expect.any(String));
	});
});

describe('POST /api/auth/sign-in and the session cookie', () => {
	test('sets an httpOnly, SameSite=Lax cookie that GET /api/me then recognises', async () => {
		const { email, cookies } = await signUpAndIn('teacher');
		const cookie = cookies.jar.get(SESSION_COOKIE_NAME)!;
		expect(cookie.value).toMatch(/^[A-Za-z0-9_-]{43}$/);
		expect(cookie.options).toMatchObject({ httpOnly: true, sameSite: 'lax', path: '/' });
		// Not in production here: Secure would stop the cookie over plain http on a LAN address.
		expect(cookie.options.secure).toBe(false);

		const me = await call(meGet, { routeId: '/api/me', cookies });
		expect(me.status).toBe(200);
		expect(await me.json()).toEqual({
			id: expect.any(String),
			name: 'Api Player',
			email,
			role: 'teacher',
			emailVerified: false,
			settings: {
				timezone: 'UTC',
				instrument: 'concert',
				digestHour: 7,
				digestEnabled: true,
				desiredRetention: 0.9,
				dailyMinutes: 15,
				keyOrder: 'weighted',
				dayStartHour: 4,
				newPerDay: 5
			}
		});
	});

	test('GET /api/me answers 401 without a session and with a made-up cookie', async () => {
		expect((await call(meGet, { routeId: '/api/me' })).status).toBe(401);
		const forged = new FakeCookies();
		forged.set(SESSION_COOKIE_NAME, 'A'.repeat(43), {});
		const res = await call(meGet, { routeId: '/api/me', cookies: forged });
		expect(res.status).toBe(401);
		// The bad cookie is cleared.
		expect(forged.jar.get(SESSION_COOKIE_NAME)?.value).toBe('');
	});

	test('a wrong password answers 401 and sets no cookie', async () => {
		const { email } = await signUpAndIn();
		const cookies = new FakeCookies();
		const res = await call(signInPost, {
			method: 'POST',
			routeId: '/api/auth/sign-in',
			body: { email, password: 'walking-bass-8' },
			cookies
		});
		expect(res.status).toBe(401);
		expect(cookies.jar.size).toBe(0);
	});

	test.each([
		[{ email: 'x@example.test' }, 422],
		[{ email: 5, password: 5 }, 422],
		['{not json', 400]
	])('malformed sign-in %j answers %i', async (body, status) => {
		const res = await call(signInPost, { method: 'POST', routeId: '/api/auth/sign-in', body });
		expect(res.status).toBe(status);
	});

	test('POST /api/auth/sign-out answers 204 and the old cookie no longer works', async () => {
		const { cookies } = await signUpAndIn();
		const token = cookies.get(SESSION_COOKIE_NAME)!;
		const res = await call(signOutPost, {
			method: 'POST',
			routeId: '/api/auth/sign-out',
			cookies
		});
		expect(res.status).toBe(204);
		expect(cookies.get(SESSION_COOKIE_NAME)).toBe('');
		const replay = new FakeCookies();
		replay.set(SESSION_COOKIE_NAME, token, {});
		expect((await call(meGet, { routeId: '/api/me', cookies: replay })).status).toBe(401);
	});
});

describe('rate limits', () => {
	const signInFrom = (email: string, password: string, addr: string) =>
		call(signInPost, {
			method: 'POST',
			routeId: '/api/auth/sign-in',
			body: { email, password },
			address: addr
		});

	test('after 5 failures from one address for one e-mail, the 6th try from there answers 429 with Retry-After, even with the right password', async () => {
		const { email } = await signUpAndIn();
		for (let i = 0; i < 5; i++) {
			expect((await signInFrom(email, 'wrong-guess-00', '198.51.100.1')).status).toBe(401);
		}
		const limited = await signInFrom(email, PASSWORD, '198.51.100.1');
		expect(limited.status).toBe(429);
		const retryAfter = Number(limited.headers.get('Retry-After'));
		expect(retryAfter).toBeGreaterThan(0);
		expect(retryAfter).toBeLessThanOrEqual(15 * 60 + 1);
		expect(await limited.json()).toMatchObject({ error: { retryAfterSeconds: retryAfter } });
	});

	test('wrong passwords from elsewhere do not lock the owner out: a correct one is slowed down, not refused', async () => {
		const pauses: number[] = [];
		await configureAuthLimits(
			{ signInEmail: { max: 3, windowMs: 60_000 } },
			{ slowDownMs: 2_500, pause: async (ms) => void pauses.push(ms) }
		);
		const { email } = await signUpAndIn();
		// Five places, one wrong guess each; the first three are not slowed.
		const statuses = [];
		for (let i = 0; i < 5; i++) {
			statuses.push((await signInFrom(email, 'wrong-guess-00', `198.51.100.${i + 20}`)).status);
		}
		expect(statuses).toEqual([401, 401, 401, 401, 401]);
		expect(pauses).toEqual([2_500, 2_500]);
		// The owner, from home: let in after the same wait.
		const owner = await signInFrom(email, PASSWORD, '203.0.113.50');
		expect(owner.status).toBe(200);
		expect(pauses).toEqual([2_500, 2_500, 2_500]);
	});

	test('parallel wrong tries cannot outrun the count, though nothing is counted in advance', async () => {
		await configureAuthLimits({ signInPair: { max: 3, windowMs: 60_000 } });
		const { email } = await signUpAndIn();
		const burst = await Promise.all(
			Array.from({ length: 8 }, () => signInFrom(email, 'wrong-guess-00', '198.51.100.40'))
		);
		const statuses = burst.map((res) => res.status).sort();
		expect(statuses).toEqual([401, 401, 401, 429, 429, 429, 429, 429]);
	});

	// 120 password checks on a shared machine: the time allowed is generous, nothing is timed.
	test(
		'100 concurrent correct sign-ins from one address all succeed',
		{ timeout: 180_000 },
		async () => {
			const passwordHash = await hashPassword(PASSWORD);
			const users = await User.bulkCreate(
				Array.from({ length: 100 }, (_, i) => ({
					email: `crowd${i}@example.test`,
					name: `Crowd ${i}`,
					passwordHash
				}))
			);
			const answers = await Promise.all(
				users.map((user) => signInFrom(user.email, PASSWORD, '192.0.2.100'))
			);
			expect(answers.map((res) => res.status)).toEqual(users.map(() => 200));
			// And twenty at once for one account, from one place.
			const same = await Promise.all(
				Array.from({ length: 20 }, () => signInFrom(users[0].email, PASSWORD, '192.0.2.100'))
			);
			expect(same.map((res) => res.status)).toEqual(same.map(() => 200));
		}
	);

	test('a try refused for a missing field counts nothing, and a success is never a failure', async () => {
		await configureAuthLimits({ signInAddress: { max: 2, windowMs: 60_000 } });
		const { email } = await signUpAndIn();
		const attempt = (body: Record<string, string>) =>
			call(signInPost, {
				method: 'POST',
				routeId: '/api/auth/sign-in',
				body,
				address: '192.0.2.9'
			});
		for (let i = 0; i < 3; i++) expect((await attempt({ email })).status).toBe(422);
		for (let i = 0; i < 3; i++)
			expect((await attempt({ email, password: PASSWORD })).status).toBe(200);
		expect((await attempt({ email, password: 'wrong-guess-00' })).status).toBe(401);
		expect((await attempt({ email, password: 'wrong-guess-00' })).status).toBe(401);
		expect((await attempt({ email, password: PASSWORD })).status).toBe(429);
	});

	test('one client address is limited across many e-mails', async () => {
		await configureAuthLimits({ signInAddress: { max: 3, windowMs: 60_000 } });
		const statuses = [];
		for (let i = 0; i < 4; i++) {
			const res = await signInFrom(`spray${i}@example.test`, 'wrong-guess-00', '192.0.2.1');
			statuses.push(res.status);
		}
		expect(statuses).toEqual([401, 401, 401, 429]);
	});

	test('a successful sign-in clears the failures of that e-mail from that address', async () => {
		await configureAuthLimits({ signInPair: { max: 2, windowMs: 60_000 } });
		const { email } = await signUpAndIn();
		const attempt = (password: string) => signInFrom(email, password, '192.0.2.3');
		expect((await attempt('wrong-guess-00')).status).toBe(401);
		expect((await attempt(PASSWORD)).status).toBe(200);
		expect((await attempt('wrong-guess-00')).status).toBe(401);
		expect((await attempt('wrong-guess-00')).status).toBe(401);
		expect((await attempt(PASSWORD)).status).toBe(429);
	});

	test('sign-up is limited per client address', async () => {
		await configureAuthLimits({ signUpAddress: { max: 2, windowMs: 60_000 } });
		const statuses = [];
		for (let i = 0; i < 3; i++) {
			const res = await call(signUpPost, {
				method: 'POST',
				routeId: '/api/auth/sign-up',
				body: { email: address(), password: PASSWORD, name: 'Flood', role: 'learner' },
				address: '192.0.2.2'
			});
			statuses.push(res.status);
		}
		expect(statuses).toEqual([201, 201, 429]);
	});
});

describe('the role gate in hooks.server.ts', () => {
	const ok = () => new Response('page', { status: 200 });

	test.each([
		['/(learn)/home', '/home'],
		['/(teach)/teach', '/teach'],
		['/(admin)/admin/outbox', '/admin/outbox']
	])('an anonymous visitor of %s is sent to sign in and back', async (routeId, path) => {
		const res = await call(ok, { routeId, path });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(`/sign-in?next=${encodeURIComponent(path)}`);
	});

	test('a learner may open learner pages but gets 403 from teacher and admin pages and admin APIs', async () => {
		const { cookies } = await signUpAndIn('learner');
		const status = async (routeId: string, path: string) =>
			(await call(ok, { routeId, path, cookies })).status;
		expect(await status('/(learn)/home', '/home')).toBe(200);
		expect(await status('/(learn)/settings', '/settings')).toBe(200);
		expect(await status('/(teach)/teach', '/teach')).toBe(403);
		expect(await status('/(admin)/admin', '/admin')).toBe(403);
		expect(await status('/(admin)/admin/outbox', '/admin/outbox')).toBe(403);
		expect(await status('/api/admin/outbox', '/api/admin/outbox')).toBe(403);
		expect(await status('/(public)', '/')).toBe(200);
	});

	test('a teacher may open teacher pages, not admin ones; an admin may open all', async () => {
		const { cookies } = await signUpAndIn('teacher');
		const status = async (routeId: string, path: string) =>
			(await call(ok, { routeId, path, cookies })).status;
		expect(await status('/(teach)/teach', '/teach')).toBe(200);
		expect(await status('/(admin)/admin', '/admin')).toBe(403);

		const admin = await signUpAndIn('learner');
		await makeAdmin(admin.email);
		const adminStatus = async (routeId: string, path: string) =>
			(await call(ok, { routeId, path, cookies: admin.cookies })).status;
		expect(await adminStatus('/(admin)/admin/outbox', '/admin/outbox')).toBe(200);
		expect(await adminStatus('/api/admin/outbox', '/api/admin/outbox')).toBe(200);
		expect(await adminStatus('/(teach)/teach', '/teach')).toBe(200);
	});

	test('admin APIs answer 401 JSON to an anonymous caller', async () => {
		const res = await call(ok, { routeId: '/api/admin/health', path: '/api/admin/health' });
		expect(res.status).toBe(401);
		expect(await res.json()).toEqual({ error: { message: 'Sign in first.' } });
	});

	test('admin APIs refuse a learner with the same 403 JSON as the endpoints themselves', async () => {
		const { cookies } = await signUpAndIn('learner');
		const res = await call(ok, {
			routeId: '/api/admin/health',
			path: '/api/admin/health',
			cookies
		});
		expect(res.status).toBe(403);
		expect(await res.json()).toEqual({
			error: { message: 'This endpoint is for admin accounts.' }
		});
	});
});

describe('handleError in hooks.server.ts', () => {
	const report = (status: number, message: string) =>
		handleError({
			error: new Error('the detail'),
			event: fakeEvent({ method: 'POST', path: '/sign-in' }) as never,
			status,
			message
		});

	test.each([
		[404, 'Not Found'],
		[405, 'Method Not Allowed'],
		[415, 'Unsupported Media Type']
	])('a %i keeps Kit’s own text and logs nothing: the request was at fault', (status, text) => {
		const log = vi.spyOn(console, 'error').mockImplementation(() => {});
		expect(report(status, text)).toEqual({ message: text });
		expect(log).not.toHaveBeenCalled();
		log.mockRestore();
	});

	test('a 500 is logged in full and answered with a plain sentence, never the detail', () => {
		const log = vi.spyOn(console, 'error').mockImplementation(() => {});
		expect(report(500, 'Internal Error')).toEqual({
			message: 'Something went wrong on our side. Please try again in a moment.'
		});
		expect(log).toHaveBeenCalledWith(
			'[POST /sign-in]',
			expect.objectContaining({ message: 'the detail' })
		);
		log.mockRestore();
	});
});
