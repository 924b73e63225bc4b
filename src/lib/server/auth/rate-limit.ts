/**
 * An in-memory sliding-window limiter: at most `max` hits per key within any `windowMs`. Memory
 * is per process, which suits the single-node default; several nodes would need a shared store.
 */
export interface RateLimiterOptions {
	/** Hits allowed per key within one window. */
	max: number;
	windowMs: number;
}

export interface RateLimitResult {
	allowed: boolean;
	/** Whole seconds until the next hit would be allowed; 0 when allowed. */
	retryAfterSeconds: number;
}

export interface RateLimiter {
	/** Count one hit for `key` at `now` (ms since the epoch) and say whether it may go ahead. */
	consume(key: string, now?: number): RateLimitResult;
	/** Would a hit be allowed now? Counts nothing. */
	peek(key: string, now?: number): RateLimitResult;
	/** Forget the hits of one key (after a successful sign-in) or of all keys. */
	reset(key?: string): void;
	/** Take back one hit of `key` counted at `at` (a try that turned out not to count). */
	release(key: string, at: number): void;
}

/**
 * @example
 * const limiter = createRateLimiter({ max: 2, windowMs: 60_000 });
 * limiter.consume('a', 0); limiter.consume('a', 1); limiter.consume('a', 2)
 * // → { allowed: false, retryAfterSeconds: 60 }
 */
export function createRateLimiter(options: RateLimiterOptions): RateLimiter {
	const { max, windowMs } = options;
	if (!Number.isInteger(max) || max < 1) {
		throw new RangeError(`Rate limit max must be a positive integer, got ${max}`);
	}
	if (!(windowMs > 0)) {
		throw new RangeError(`Rate limit window must be positive, got ${windowMs} ms`);
	}
	/** Hit times per key, oldest first; rejected hits are not recorded. */
	const hits = new Map<string, number[]>();
	let sweepAt = 0;

	function recent(key: string, now: number): number[] {
		const list = (hits.get(key) ?? []).filter((t) => t > now - windowMs);
		if (list.length) hits.set(key, list);
		else hits.delete(key);
		return list;
	}

	function judge(list: number[], now: number): RateLimitResult {
		if (list.length < max) return { allowed: true, retryAfterSeconds: 0 };
		// The oldest counted hit leaves the window at `list[0] + windowMs`.
		const waitMs = list[list.length - max] + windowMs - now;
		return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil(waitMs / 1000)) };
	}

	// Drop idle keys now and then so that a stream of one-off keys cannot grow the map forever.
	function sweep(now: number): void {
		if (now < sweepAt) return;
		sweepAt = now + windowMs;
		for (const key of [...hits.keys()]) recent(key, now);
	}

	return {
		consume(key, now = Date.now()) {
			sweep(now);
			const list = recent(key, now);
			const result = judge(list, now);
			if (result.allowed) {
				list.push(now);
				hits.set(key, list);
			}
			return result;
		},
		peek(key, now = Date.now()) {
			return judge(recent(key, now), now);
		},
		reset(key) {
			if (key === undefined) hits.clear();
			else hits.delete(key);
		},
		release(key, at) {
			const list = hits.get(key);
			const index = list ? list.lastIndexOf(at) : -1;
			if (!list || index < 0) return;
			list.splice(index, 1);
			if (list.length === 0) hits.delete(key);
		}
	};
}
