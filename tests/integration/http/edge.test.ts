import { afterAll, beforeAll, beforeEach, describe, expect, test, vi } from 'vitest';
import { isRedirect, type RequestEvent } from '@sveltejs/kit';
import { ConnectionRefusedError } from 'sequelize';
import { handleError } from '../../../src/hooks.server';
import { configureAuthLimits } from '../../../src/lib/server/auth/limits';
import {
	handleActionNames,
	handleDatabaseFailure,
	handleRequestOrigin,
	handleSecurityHeaders,
	handleTextFields
} from '../../../src/lib/server/http/edge';
import { readJsonBody } from '../../../src/lib/server/http/json';
import { ownActionNames } from '../../../src/lib/server/http/routes';
import { POST as signUpPost } from '../../../src/routes/api/auth/sign-up/+server';
import { load as signOutLoad } from '../../../src/routes/(auth)/sign-out/+page.server';
import { fakeEvent, type FakeEventInput } from '../support/fake-event';
import { openTestWorld, type TestWorld } from '../support/world';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
	// Importing a page's server module the first time is slow: done here, not inside a test.
	await ownActionNames('/(auth)/sign-in');
});
afterAll(() => world.close());
beforeEach(() => configureAuthLimits());

type Handle = typeof handleTextFields;

/** An event as the hooks see it, with extra request headers. */
function event(input: FakeEventInput & { headers?: Record<string, string> }) {
	const e = fakeEvent(input);
	if (input.headers) {
		const headers = new Headers(e.request.headers);
		for (const [k, v] of Object.entries(input.headers)) headers.set(k, v);
		e.request = new Request(e.request, { headers, duplex: 'half' } as RequestInit);
	}
	return e;
}

/** Run one handle; `resolve` reads the body the way a route would, to prove it is still there. */
async function run(handle: Handle, e: ReturnType<typeof event>, status = 200) {
	let reached = false;
	let bodyText = '';
	const response = await handle({
		event: e as unknown as RequestEvent,
		resolve: async (ev) => {
			reached = true;
			bodyText = ev.request.body ? await ev.request.text() : '';
			return new Response('page', { status, headers: { 'content-type': 'text/html' } });
		}
	});
	return { response, reached, bodyText };
}

const form = 'application/x-www-form-urlencoded';

describe('action names', () => {
	test.each([
		'__proto__',
		'constructor',
		'hasOwnProperty',
		'valueOf',
		'toString',
		'default',
		'',
		'nope'
	])('?/%s on the sign-in page answers 404 before the framework looks it up', async (name) => {
		const { response, reached } = await run(
			handleActionNames,
			event({
				method: 'POST',
				path: `/sign-in?/${name}`,
				routeId: '/(auth)/sign-in',
				body: 'email=x',
				contentType: form
			})
		);
		expect(reached).toBe(false);
		expect(response.status).toBe(404);
		expect(await response.text()).toContain('no form action named');
	});

	test('the page’s own actions pass: the default one and a named one', async () => {
		for (const [path, routeId] of [
			['/sign-in', '/(auth)/sign-in'],
			['/admin?/setRole', '/(admin)/admin']
		]) {
			const { reached } = await run(
				handleActionNames,
				event({ method: 'POST', path, routeId, body: 'email=x', contentType: form })
			);
			expect(reached, path).toBe(true);
		}
	});

	test('an enhanced form gets the 404 as an action result', async () => {
		const { response } = await run(
			handleActionNames,
			event({
				method: 'POST',
				path: '/sign-in?/constructor',
				routeId: '/(auth)/sign-in',
				body: 'email=x',
				contentType: form,
				headers: { 'x-sveltekit-action': 'true' }
			})
		);
		expect(response.status).toBe(404);
		expect(await response.json()).toEqual({
			type: 'error',
			error: { message: 'This page has no form action named “constructor”.' }
		});
	});
});

describe('origins', () => {
	test.each([
		[{ origin: 'http://evil.test' }, 403],
		[{ 'sec-fetch-site': 'cross-site' }, 403],
		[{ 'sec-fetch-site': 'same-site' }, 403],
		[{ origin: 'http://twelvefold.test' }, 200],
		[{ 'sec-fetch-site': 'same-origin' }, 200],
		[{}, 200]
	])('POST /api/auth/sign-out with %j answers %i', async (headers, status) => {
		const { response } = await run(
			handleRequestOrigin,
			event({ method: 'POST', path: '/api/auth/sign-out', routeId: '/api/auth/sign-out', headers })
		);
		expect(response.status).toBe(status);
		if (status === 403) {
			expect(await response.json()).toEqual({
				error: { message: 'Requests that change something must come from this site.' }
			});
		}
	});

	test('a read from another origin is no concern of this check', async () => {
		const { reached } = await run(
			handleRequestOrigin,
			event({ path: '/api/me', routeId: '/api/me', headers: { origin: 'http://evil.test' } })
		);
		expect(reached).toBe(true);
	});
});

describe('control characters', () => {
	test('a NUL in a JSON field answers 422 in the API shape, naming the field', async () => {
		const { response, reached } = await run(
			handleTextFields,
			event({
				method: 'POST',
				path: '/api/auth/sign-in',
				routeId: '/api/auth/sign-in',
				body: { email: 'a\u0000@example.test', password: 'x' }
			})
		);
		expect(reached).toBe(false);
		expect(response.status).toBe(422);
		expect(await response.json()).toEqual({
			error: {
				message: 'The field “email” holds a control character (U+0000); remove it and send again.',
				field: 'email'
			}
		});
	});

	test.each(['/(auth)/sign-in', '/(auth)/sign-up', '/(auth)/forgot-password', '/(admin)/admin'])(
		'a NUL in a form field of %s answers 422 with a readable page',
		async (routeId) => {
			const { response } = await run(
				handleTextFields,
				event({
					method: 'POST',
					path: '/x',
					routeId,
					body: 'email=a%00b%40example.test',
					contentType: form
				})
			);
			expect(response.status).toBe(422);
			expect(response.headers.get('content-type')).toContain('text/html');
			expect(await response.text()).toContain('holds a control character (U+0000)');
		}
	);

	test('clean text passes, and the route can still read the body', async () => {
		const body = { abc: 'X:1\nK:C\nCDEF|', to: 'Eb' };
		const { reached, bodyText } = await run(
			handleTextFields,
			event({ method: 'POST', path: '/api/transpose', routeId: '/api/transpose', body })
		);
		expect(reached).toBe(true);
		expect(JSON.parse(bodyText)).toEqual(body);
	});

	test('a control character in the address answers 400 on any request', async () => {
		const { response } = await run(
			handleTextFields,
			event({ path: '/reset-password?token=%00', routeId: '/(auth)/reset-password' })
		);
		expect(response.status).toBe(400);
	});
});

describe('headers', () => {
	test('every answer is sniff-proof, unframeable and sends no referrer elsewhere', async () => {
		const { response } = await run(handleSecurityHeaders, event({ path: '/' }));
		expect(response.headers.get('x-content-type-options')).toBe('nosniff');
		expect(response.headers.get('referrer-policy')).toBe('same-origin');
		expect(response.headers.get('content-security-policy')).toContain("frame-ancestors 'none'");
		expect(response.headers.get('cache-control')).toBeNull();
	});

	test('an answer to a signed-in person is never stored', async () => {
		const locals = { user: { id: 1 }, session: null } as unknown as App.Locals;
		const { response } = await run(handleSecurityHeaders, event({ path: '/home', locals }));
		expect(response.headers.get('cache-control')).toBe('no-store');
	});
});

describe('failures', () => {
	test('a database that fails answers 503 with Retry-After, never a 500', async () => {
		// handleError logs the fault in full for the operator; not needed in the test output.
		const log = vi.spyOn(console, 'error').mockImplementation(() => {});
		const e = event({ path: '/api/admin/health', routeId: '/api/admin/health' });
		const response = await handleDatabaseFailure({
			event: e as unknown as RequestEvent,
			resolve: async () => {
				const body = handleError({
					error: new ConnectionRefusedError(new Error('connect ECONNREFUSED')),
					event: e as unknown as RequestEvent,
					status: 500,
					message: 'Internal Error'
				});
				return Response.json(body, { status: 500 });
			}
		});
		log.mockRestore();
		expect(response.status).toBe(503);
		expect(response.headers.get('retry-after')).toBe('5');
		expect(await response.json()).toEqual({
			error: { message: 'The database could not answer just now. Please try again in a moment.' }
		});
	});

	test('a chunked body over the limit answers 413, not 400', async () => {
		const chunk = new TextEncoder().encode('x'.repeat(8 * 1024));
		let sent = 0;
		const stream = new ReadableStream<Uint8Array>({
			pull(controller) {
				if (sent++ < 4) controller.enqueue(chunk);
				else controller.close();
			}
		});
		const request = new Request('http://twelvefold.test/api/auth/sign-in', {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: stream,
			duplex: 'half'
		} as RequestInit);
		const read = await readJsonBody(request, 16 * 1024);
		expect(read.ok).toBe(false);
		if (!read.ok) expect(read.response.status).toBe(413);
	});

	test('a body the server cut off at its own cap is also 413', async () => {
		const stream = new ReadableStream<Uint8Array>({
			pull(controller) {
				controller.error(Object.assign(new Error('request body size exceeded'), { status: 413 }));
			}
		});
		const request = new Request('http://twelvefold.test/api/auth/sign-in', {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: stream,
			duplex: 'half'
		} as RequestInit);
		const read = await readJsonBody(request);
		expect(!read.ok && read.response.status).toBe(413);
	});
});

describe('account routes at the edge', () => {
	test('sign-ups without an e-mail are refused before the limiter, so they fill no shared bucket', async () => {
		configureAuthLimits({
			signUpEmail: { max: 1, windowMs: 60_000 },
			signUpAddress: { max: 100, windowMs: 60_000 }
		});
		const post = (body: Record<string, unknown>, address: string) =>
			signUpPost(
				fakeEvent({ method: 'POST', path: '/api/auth/sign-up', body, address }) as never
			) as Promise<Response>;
		for (let i = 0; i < 3; i++) {
			const res = await post(
				{ password: 'walking-bass-7', name: 'X', role: 'learner' },
				`198.51.100.${i}`
			);
			expect(res.status).toBe(422);
			expect(await res.json()).toMatchObject({ error: { field: 'email' } });
		}
		const real = await post(
			{
				email: 'edge-signup@example.test',
				password: 'walking-bass-7',
				name: 'Real',
				role: 'learner'
			},
			'198.51.100.9'
		);
		expect(real.status).toBe(201);
	});

	test('GET /sign-out sends a visitor to the front page and asks a signed-in person', async () => {
		try {
			signOutLoad(fakeEvent({ path: '/sign-out' }) as never);
			expect.unreachable();
		} catch (thrown) {
			expect(isRedirect(thrown) && thrown.location).toBe('/');
		}
		const locals = { user: { name: 'Lou Pardee' }, session: null } as unknown as App.Locals;
		expect(signOutLoad(fakeEvent({ path: '/sign-out', locals }) as never)).toEqual({
			name: 'Lou Pardee'
		});
	});
});
