import { describe, expect, test } from 'vitest';
import { createRateLimiter } from '../../../src/lib/server/auth/rate-limit';

describe('createRateLimiter', () => {
	test('allows max hits within a window and refuses the next one with the wait in seconds', () => {
		const limiter = createRateLimiter({ max: 3, windowMs: 60_000 });
		const results = [0, 1_000, 2_000, 3_000].map((t) => limiter.consume('k', t));
		expect(results).toEqual([
			{ allowed: true, retryAfterSeconds: 0 },
			{ allowed: true, retryAfterSeconds: 0 },
			{ allowed: true, retryAfterSeconds: 0 },
			// The hit at 0 leaves the window at 60 000; from 3 000 that is 57 s away.
			{ allowed: false, retryAfterSeconds: 57 }
		]);
	});

	test('the window slides: a hit is allowed again once the oldest one has left it', () => {
		const limiter = createRateLimiter({ max: 2, windowMs: 10_000 });
		limiter.consume('k', 0);
		limiter.consume('k', 5_000);
		expect(limiter.consume('k', 9_999).allowed).toBe(false);
		expect(limiter.consume('k', 10_000)).toEqual({ allowed: true, retryAfterSeconds: 0 });
		// Now 5 000 and 10 000 are in the window: refused until 15 000.
		expect(limiter.consume('k', 12_000)).toEqual({ allowed: false, retryAfterSeconds: 3 });
	});

	test('refused hits are not counted, so waiting out the window always helps', () => {
		const limiter = createRateLimiter({ max: 1, windowMs: 1_000 });
		limiter.consume('k', 0);
		for (let t = 100; t < 1_000; t += 100) expect(limiter.consume('k', t).allowed).toBe(false);
		expect(limiter.consume('k', 1_000).allowed).toBe(true);
	});

	test('keys are counted apart and reset forgets one key or all', () => {
		const limiter = createRateLimiter({ max: 1, windowMs: 60_000 });
		expect(limiter.consume('a', 0).allowed).toBe(true);
		expect(limiter.consume('b', 0).allowed).toBe(true);
		expect(limiter.consume('a', 1).allowed).toBe(false);
		limiter.reset('a');
		expect(limiter.consume('a', 2).allowed).toBe(true);
		expect(limiter.consume('b', 2).allowed).toBe(false);
		limiter.reset();
		expect(limiter.consume('b', 3).allowed).toBe(true);
	});

	test('release takes back one hit of a key at its time and leaves the others', () => {
		const limiter = createRateLimiter({ max: 2, windowMs: 60_000 });
		limiter.consume('k', 0);
		limiter.consume('k', 1_000);
		expect(limiter.peek('k', 2_000).allowed).toBe(false);
		limiter.release('k', 1_000);
		limiter.release('k', 5_000); // never counted: nothing to take back
		limiter.release('other', 0);
		expect(limiter.consume('k', 2_000)).toEqual({ allowed: true, retryAfterSeconds: 0 });
		expect(limiter.consume('k', 3_000)).toEqual({ allowed: false, retryAfterSeconds: 57 });
	});

	test('peek answers like consume would but counts nothing', () => {
		const limiter = createRateLimiter({ max: 1, windowMs: 60_000 });
		expect(limiter.peek('k', 0)).toEqual({ allowed: true, retryAfterSeconds: 0 });
		expect(limiter.peek('k', 0)).toEqual({ allowed: true, retryAfterSeconds: 0 });
		limiter.consume('k', 0);
		expect(limiter.peek('k', 500)).toEqual({ allowed: false, retryAfterSeconds: 60 });
	});

	test('the wait is never shown as zero seconds while refused', () => {
		const limiter = createRateLimiter({ max: 1, windowMs: 1_000 });
		limiter.consume('k', 0);
		expect(limiter.consume('k', 999)).toEqual({ allowed: false, retryAfterSeconds: 1 });
	});

	test.each([
		[{ max: 0, windowMs: 1000 }, /positive integer, got 0/],
		[{ max: 1.5, windowMs: 1000 }, /positive integer, got 1.5/],
		[{ max: 1, windowMs: 0 }, /must be positive, got 0 ms/],
		[{ max: 1, windowMs: Number.NaN }, /must be positive, got NaN ms/]
	])('refuses nonsense options %o', (options, message) => {
		expect(() => createRateLimiter(options)).toThrow(message);
	});
});
