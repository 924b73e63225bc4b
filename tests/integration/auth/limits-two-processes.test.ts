/**
 * The sign-in limits with two built servers (`node build`) sharing one SQLite file, as two
 * processes behind one load balancer would: failures counted by one are seen by the other.
 * With counters in each process's memory, each server would allow its own five failures.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { hashPassword } from '../../../src/lib/server/auth/password';
import { User } from '../../../src/lib/server/db/models/index';
import { ensureBuild, startBuiltServer, type BuiltServer } from '../support/built-server';
import { openTestWorld, type TestWorld } from '../support/world';

const PASSWORD = 'walking-bass-7';
let world: TestWorld;
let servers: BuiltServer[] = [];

beforeAll(async () => {
	ensureBuild();
	world = await openTestWorld();
	const passwordHash = await hashPassword(PASSWORD);
	await User.bulkCreate(
		['one', 'two', 'three', 'four'].map((n) => ({
			email: `${n}@example.test`,
			name: n,
			passwordHash
		}))
	);
	// One after the other: the first applies the migrations (none left here), the second finds none.
	servers = [await startBuiltServer(world.dataDir), await startBuiltServer(world.dataDir)];
}, 600_000);

afterAll(async () => {
	await Promise.all(servers.map((s) => s.stop()));
	await world?.close();
});

function signIn(server: BuiltServer, email: string, password: string) {
	return fetch(`${server.origin}/api/auth/sign-in`, {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify({ email, password }),
		signal: AbortSignal.timeout(30_000)
	});
}

describe('two server processes on one database', () => {
	test('five failures spread over both lock this address out of the account on both', async () => {
		const [a, b] = servers;
		const statuses = [];
		for (let i = 0; i < 7; i++) {
			statuses.push((await signIn(i % 2 ? b : a, 'one@example.test', 'wrong-guess-00')).status);
		}
		expect(statuses).toEqual([401, 401, 401, 401, 401, 429, 429]);
		// The hard limit holds for the right password too, on either server.
		const limited = await signIn(a, 'one@example.test', PASSWORD);
		expect(limited.status).toBe(429);
		expect(Number(limited.headers.get('Retry-After'))).toBeGreaterThan(0);
		expect((await signIn(b, 'one@example.test', PASSWORD)).status).toBe(429);
		// Another account from the same address is not locked (4 more failures would be).
		expect((await signIn(b, 'two@example.test', PASSWORD)).status).toBe(200);
	});

	test('a burst at both at once: at most one check per process beyond the limit', async () => {
		const [a, b] = servers;
		const answers = await Promise.all(
			Array.from({ length: 20 }, (_, i) =>
				signIn(i % 2 ? b : a, 'three@example.test', 'nope-000000')
			)
		);
		const wrong = answers.filter((r) => r.status === 401).length;
		const limited = answers.filter((r) => r.status === 429).length;
		expect(wrong + limited).toBe(20);
		// Five failures allowed; each process may have one check under way when the fifth lands.
		expect(wrong).toBeGreaterThanOrEqual(5);
		expect(wrong).toBeLessThanOrEqual(5 + servers.length - 1);
	});

	test("the sign-in form's 429 carries Retry-After from the real server, as a page and as JSON", async () => {
		const [a, b] = servers;
		const post = (server: BuiltServer, password: string, accept: string) =>
			fetch(`${server.origin}/sign-in`, {
				method: 'POST',
				headers: {
					'content-type': 'application/x-www-form-urlencoded',
					origin: server.origin,
					accept
				},
				body: new URLSearchParams({ email: 'four@example.test', password }).toString(),
				redirect: 'manual',
				signal: AbortSignal.timeout(30_000)
			});
		for (let i = 0; i < 5; i++) {
			expect((await post(i % 2 ? b : a, 'wrong-guess-00', 'text/html')).status).toBe(400);
		}
		const page = await post(b, PASSWORD, 'text/html');
		expect(page.status).toBe(429);
		expect(Number(page.headers.get('retry-after'))).toBeGreaterThan(0);
		expect(await page.text()).toContain('Too many tries');
		// What the page's own script receives when it posts the form.
		const enhanced = await post(a, PASSWORD, 'application/json');
		expect(Number(enhanced.headers.get('retry-after'))).toBeGreaterThan(0);
		expect(await enhanced.json()).toMatchObject({ type: 'failure', status: 429 });
	});
});
