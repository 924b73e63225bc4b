import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { QueryTypes } from 'sequelize';
import {
	createRateLimiter,
	databaseStore,
	memoryStore,
	waitMs,
	type RateLimitStore
} from '../../../src/lib/server/auth/rate-limit';
import { closeDb, getDb, openDb } from '../../../src/lib/server/db/index';
import { migrate } from '../../../src/lib/server/db/migrate';
import { openTestWorld, type TestWorld } from '../support/world';

/**
 * The limiter against each store: in memory, in a SQLite file, and in PostgreSQL when
 * TEST_POSTGRES_URL is set (a database of its own, `…_limits`, made by .ci/postgres.sh, so that
 * this file can run beside the data-layer test that empties the shared one).
 */

/** A time at the start of a window for every window length used below. */
const T = 1_000 * 60 * 60 * 1000;
let bucketNumber = 0;
/** A fresh bucket per test, so that tests sharing a store never see each other's counts. */
const bucket = () => `test-${process.pid}-${(bucketNumber += 1)}`;

const postgresUrl = process.env.TEST_POSTGRES_URL;
const limitsUrl = postgresUrl?.replace(/\/([^/?]+)(\?|$)/, '/$1_limits$2') ?? '';

function limiterSuite(name: string, store: () => RateLimitStore) {
	const limiter = (max: number, windowMs: number) =>
		createRateLimiter(bucket(), { max, windowMs }, store());

	describe(`a limiter over ${name}`, () => {
		test('allows max hits within a window and refuses the next one with the wait in seconds', async () => {
			const l = limiter(3, 60_000);
			const results = [];
			for (const t of [0, 1_000, 2_000, 3_000]) results.push(await l.consume('k', T + t));
			expect(results).toEqual([
				{ allowed: true, retryAfterSeconds: 0 },
				{ allowed: true, retryAfterSeconds: 0 },
				{ allowed: true, retryAfterSeconds: 0 },
				// Three hits fill this window; the next is allowed just after it ends (57 s away),
				// rounded up to whole seconds.
				{ allowed: false, retryAfterSeconds: 58 }
			]);
		});

		test('the window slides: no double burst across a window boundary', async () => {
			const l = limiter(2, 10_000);
			expect((await l.consume('k', T + 9_000)).allowed).toBe(true);
			expect((await l.consume('k', T + 9_500)).allowed).toBe(true);
			// Just after the boundary the previous window still counts almost fully (2 × 0.9999):
			// one more hit fits under 2, a second does not.
			expect((await l.consume('k', T + 10_001)).allowed).toBe(true);
			expect(await l.consume('k', T + 10_002)).toEqual({
				allowed: false,
				// 2 × (1 − e/10 000) + 1 < 2 once e > 5 000 ms into the new window.
				retryAfterSeconds: 5
			});
			// Half-way through, the previous window counts for 1: one more hit in this one fits.
			expect((await l.consume('k', T + 14_900)).allowed).toBe(false);
			expect((await l.consume('k', T + 15_100)).allowed).toBe(true);
			// Once a whole window has passed with no hits, nothing before it counts.
			expect((await l.consume('k', T + 30_000)).allowed).toBe(true);
			expect((await l.consume('k', T + 30_001)).allowed).toBe(true);
			expect((await l.consume('k', T + 30_002)).allowed).toBe(false);
		});

		test('refused hits are not counted, so waiting out the window always helps', async () => {
			const l = limiter(1, 1_000);
			await l.consume('k', T);
			for (let t = 100; t < 1_000; t += 100) {
				expect((await l.consume('k', T + t)).allowed).toBe(false);
			}
			// Had the nine refusals counted, the previous window would weigh 10 here, not 1.
			expect((await l.consume('k', T + 1_001)).allowed).toBe(true);
		});

		test('keys are counted apart, and reset forgets one key or all', async () => {
			const l = limiter(1, 60_000);
			expect((await l.consume('a', T)).allowed).toBe(true);
			expect((await l.consume('b', T)).allowed).toBe(true);
			expect((await l.consume('a', T + 1)).allowed).toBe(false);
			await l.reset('a');
			expect((await l.consume('a', T + 2)).allowed).toBe(true);
			expect((await l.consume('b', T + 2)).allowed).toBe(false);
			await l.reset();
			expect((await l.consume('b', T + 3)).allowed).toBe(true);
		});

		test('two limiters with the same bucket share their counts; other buckets do not', async () => {
			const name = bucket();
			const one = createRateLimiter(name, { max: 2, windowMs: 60_000 }, store());
			const two = createRateLimiter(name, { max: 2, windowMs: 60_000 }, store());
			const other = createRateLimiter(bucket(), { max: 2, windowMs: 60_000 }, store());
			await one.consume('k', T);
			await two.consume('k', T + 1);
			expect((await one.peek('k', T + 2)).allowed).toBe(false);
			expect((await other.consume('k', T + 2)).allowed).toBe(true);
		});

		test('release takes back one hit of a key in the window of its time', async () => {
			const l = limiter(2, 60_000);
			await l.consume('k', T);
			await l.consume('k', T + 1_000);
			expect((await l.peek('k', T + 2_000)).allowed).toBe(false);
			await l.release('k', T + 1_000);
			await l.release('other', T);
			expect(await l.consume('k', T + 2_000)).toEqual({ allowed: true, retryAfterSeconds: 0 });
			expect((await l.consume('k', T + 3_000)).allowed).toBe(false);
		});

		test('peek answers like consume would but counts nothing', async () => {
			const l = limiter(1, 60_000);
			expect(await l.peek('k', T)).toEqual({ allowed: true, retryAfterSeconds: 0 });
			expect(await l.peek('k', T)).toEqual({ allowed: true, retryAfterSeconds: 0 });
			await l.consume('k', T);
			expect(await l.peek('k', T + 500)).toEqual({ allowed: false, retryAfterSeconds: 60 });
		});

		test('the wait is never shown as zero seconds while refused', async () => {
			const l = limiter(1, 1_000);
			await l.consume('k', T);
			expect(await l.consume('k', T + 999)).toEqual({ allowed: false, retryAfterSeconds: 1 });
		});

		test('a key of any length or content is counted (it is stored hashed)', async () => {
			const l = limiter(1, 60_000);
			const long = `ünïcödé\u0000${'x'.repeat(5_000)}`;
			expect((await l.consume(long, T)).allowed).toBe(true);
			expect((await l.consume(long, T + 1)).allowed).toBe(false);
			expect((await l.consume(`${long}y`, T + 1)).allowed).toBe(true);
		});

		test('fifty hits at once on one key: exactly the maximum goes through', async () => {
			const l = limiter(10, 60_000);
			const results = await Promise.all(
				Array.from({ length: 50 }, (_, i) => l.consume('burst', T + i))
			);
			expect(results.filter((r) => r.allowed)).toHaveLength(10);
			expect((await l.peek('burst', T + 100)).allowed).toBe(false);
		});
	});
}

describe('options and arithmetic', () => {
	test.each([
		[{ max: 0, windowMs: 1000 }, /positive integer, got 0/],
		[{ max: 1.5, windowMs: 1000 }, /positive integer, got 1.5/],
		[{ max: 1, windowMs: 0 }, /must be positive, got 0 ms/],
		[{ max: 1, windowMs: Number.NaN }, /must be positive, got NaN ms/]
	])('refuses nonsense options %o', (options, message) => {
		expect(() => createRateLimiter('x', options, memoryStore())).toThrow(message);
	});

	test('the wait: within this window while it has room, else in the next one', () => {
		// prev 4, curr 1, max 3, W 100 at 10 ms in: 4 × (1 − e/100) + 1 < 3 once e > 50.
		expect(waitMs(4, 1, 3, 100, 10)).toBe(41);
		// curr 6 ≥ max 3: in the next window 6 × (1 − e/100) < 3 once e > 50, so 150 from now's start.
		expect(waitMs(0, 6, 3, 100, 10)).toBe(141);
	});
});

const memory = memoryStore();
limiterSuite('memory', () => memory);

describe('on SQLite', () => {
	let world: TestWorld;
	beforeAll(async () => {
		world = await openTestWorld();
	});
	afterAll(() => world.close());

	limiterSuite('a SQLite file', () => databaseStore);

	test('counters past their expiry are pruned by a later hit', async () => {
		const name = bucket();
		const l = createRateLimiter(name, { max: 5, windowMs: 1_000 }, databaseStore);
		await l.consume('old', T);
		const rows = () =>
			getDb().query<{ n: number }>(
				'SELECT COUNT(*) AS n FROM rate_limit_counters WHERE bucket = :name',
				{ type: QueryTypes.SELECT, replacements: { name } }
			);
		expect(Number((await rows())[0].n)).toBe(1);
		// Far later (pruning runs at most once a minute per process): the old window goes. The
		// prune is sent before the hit, and one SQLite connection answers in the order asked.
		await l.consume('new', T + 10 * 60_000);
		expect(Number((await rows())[0].n)).toBe(1);
	});
});

describe.skipIf(!postgresUrl)('on PostgreSQL', () => {
	beforeAll(async () => {
		const db = openDb(limitsUrl);
		await db.query('DROP SCHEMA public CASCADE; CREATE SCHEMA public;');
		await migrate(db);
	});
	afterAll(() => closeDb());

	limiterSuite('PostgreSQL', () => databaseStore);
});
