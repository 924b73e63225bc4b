import { createHash } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { getDb } from '../db/index';

/**
 * Rate limits: at most `max` hits per key in a sliding window of `windowMs`, estimated from two
 * fixed-window counters (the current window's hits, plus the previous window's weighted by how
 * much of it the sliding window still covers). Counters rather than a log of every hit keep one
 * row per key and window, and let a hit be counted by one atomic conditional increment, which
 * is what makes a limit hold with concurrent writers. The estimate also removes the burst that
 * plain fixed windows allow at their boundary (max just before it, max again just after).
 *
 * Refused hits are not counted, so waiting out the window always helps.
 *
 * Where the counters live is the store's business: `databaseStore` (the default) keeps them in
 * the `rate_limit_counters` table, so a limit holds across every process that shares the
 * database; `memoryStore` keeps them in this process only, for limits that are deliberately
 * per process (see where it is used for why).
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
	/** Count one hit for `key` at `now` (ms since the epoch) unless it is over the limit. */
	consume(key: string, now?: number): Promise<RateLimitResult>;
	/** Would a hit be allowed now? Counts nothing. */
	peek(key: string, now?: number): Promise<RateLimitResult>;
	/** Forget the hits of one key (after a successful sign-in) or of every key of this limiter. */
	reset(key?: string): Promise<void>;
	/** Take back one hit of `key` counted at `at` (a try that turned out not to count). */
	release(key: string, at: number): Promise<void>;
}

/** Where a limiter keeps its counters: one counter per (bucket, subject, window start). */
export interface RateLimitStore {
	/** The hits of the windows starting at `starts`, in the same order (0 where none). */
	read(bucket: string, subject: string, starts: number[]): Promise<number[]>;
	/**
	 * Add one hit to a window's counter if it holds fewer than `below` hits, in one atomic step;
	 * the new count, or null when it was already full. `expiresAt` is when the row may go.
	 */
	increment(
		bucket: string,
		subject: string,
		start: number,
		below: number,
		expiresAt: number
	): Promise<number | null>;
	/** Take one hit off a window's counter (never below zero). */
	decrement(bucket: string, subject: string, start: number): Promise<void>;
	/** Forget one subject's counters, or the whole bucket's. */
	clear(bucket: string, subject?: string): Promise<void>;
	/** Drop counters that can no longer matter at `now`. */
	prune(now: number): Promise<void>;
}

/**
 * Keys are stored hashed: the table then holds no e-mail or network address, every key has the
 * same short length, and a key of any length or content is safe to store.
 */
function subjectOf(key: string): string {
	return createHash('sha256').update(key).digest('base64url');
}

/** Counters in the database shared by every process (SQLite file or PostgreSQL). */
export const databaseStore: RateLimitStore = {
	async read(bucket, subject, starts) {
		const rows = await getDb().query<{ window_start: number | string; hits: number | string }>(
			`SELECT window_start, hits FROM rate_limit_counters
			 WHERE bucket = :bucket AND subject = :subject AND window_start IN (:starts)`,
			{ type: QueryTypes.SELECT, replacements: { bucket, subject, starts } }
		);
		// PostgreSQL returns BIGINT as a string.
		const found = new Map(rows.map((r) => [Number(r.window_start), Number(r.hits)]));
		return starts.map((s) => found.get(s) ?? 0);
	},
	async increment(bucket, subject, start, below, expiresAt) {
		if (below < 1) return null;
		// One statement, so concurrent writers (other requests, other processes) cannot both see
		// room for one more hit: the insert or the guarded update wins, or no row comes back.
		// The leading comment is deliberate: Sequelize's SQLite dialect runs any text that starts
		// with "INSERT INTO" in a mode that drops the RETURNING rows.
		const rows = await getDb().query<{ hits: number | string }>(
			`/* counted */ INSERT INTO rate_limit_counters (bucket, subject, window_start, hits, expires_at)
			 VALUES (:bucket, :subject, :start, 1, :expiresAt)
			 ON CONFLICT (bucket, subject, window_start)
			 DO UPDATE SET hits = rate_limit_counters.hits + 1
			 WHERE rate_limit_counters.hits < :below
			 RETURNING hits`,
			{ type: QueryTypes.SELECT, replacements: { bucket, subject, start, below, expiresAt } }
		);
		return rows.length ? Number(rows[0].hits) : null;
	},
	async decrement(bucket, subject, start) {
		await getDb().query(
			`UPDATE rate_limit_counters SET hits = hits - 1
			 WHERE bucket = :bucket AND subject = :subject AND window_start = :start AND hits > 0`,
			{ replacements: { bucket, subject, start } }
		);
	},
	async clear(bucket, subject) {
		await getDb().query(
			subject === undefined
				? 'DELETE FROM rate_limit_counters WHERE bucket = :bucket'
				: 'DELETE FROM rate_limit_counters WHERE bucket = :bucket AND subject = :subject',
			{ replacements: { bucket, subject: subject ?? null } }
		);
	},
	async prune(now) {
		await getDb().query('DELETE FROM rate_limit_counters WHERE expires_at < :now', {
			replacements: { now }
		});
	}
};

/** Counters in this process's memory: lost on restart, not seen by other processes. */
export function memoryStore(): RateLimitStore {
	const counters = new Map<string, { hits: number; expiresAt: number }>();
	const id = (bucket: string, subject: string, start: number) => `${bucket}\n${subject}\n${start}`;
	return {
		async read(bucket, subject, starts) {
			return starts.map((s) => counters.get(id(bucket, subject, s))?.hits ?? 0);
		},
		async increment(bucket, subject, start, below, expiresAt) {
			const counter = counters.get(id(bucket, subject, start)) ?? { hits: 0, expiresAt };
			if (counter.hits >= below) return null;
			counter.hits += 1;
			counters.set(id(bucket, subject, start), counter);
			return counter.hits;
		},
		async decrement(bucket, subject, start) {
			const counter = counters.get(id(bucket, subject, start));
			if (counter && counter.hits > 0) counter.hits -= 1;
		},
		async clear(bucket, subject) {
			const prefix = subject === undefined ? `${bucket}\n` : `${bucket}\n${subject}\n`;
			for (const key of [...counters.keys()]) if (key.startsWith(prefix)) counters.delete(key);
		},
		async prune(now) {
			for (const [key, counter] of counters) if (counter.expiresAt < now) counters.delete(key);
		}
	};
}

/** Pruning is cheap but not free: each store is pruned at most this often per process. */
const PRUNE_EVERY_MS = 60_000;
const prunedAt = new WeakMap<RateLimitStore, number>();

function maybePrune(store: RateLimitStore, now: number): void {
	if ((prunedAt.get(store) ?? -Infinity) > now - PRUNE_EVERY_MS) return;
	prunedAt.set(store, now);
	// Off the request's path: a failed prune only leaves rows for the next one.
	store.prune(now).catch((error) => console.error('Pruning rate-limit counters failed:', error));
}

/**
 * The wait until a hit is allowed again, given the previous window's hits `prev`, the current
 * one's `curr`, and how far into the current window `now` is (`elapsed`). The estimate
 * `prev × (1 − elapsed/W) + curr` must fall below `max`: within this window if `curr < max`
 * (the previous window's share fades), else only in the next one, as `curr` becomes the fading
 * share. Never reported as zero while refused.
 */
export function waitMs(prev: number, curr: number, max: number, windowMs: number, elapsed: number) {
	let at: number;
	if (curr < max) at = windowMs * (1 - (max - curr) / prev);
	else at = windowMs + windowMs * (1 - max / curr);
	// The estimate must fall strictly below the maximum: one millisecond past the crossing.
	return Math.max(at - elapsed + 1, 1);
}

/**
 * A limiter over a store. `bucket` names the limit in the store (each limit its own).
 * @example
 * const limiter = createRateLimiter('sign-up-address', { max: 2, windowMs: 60_000 });
 * await limiter.consume('a', 0); await limiter.consume('a', 1); await limiter.consume('a', 2)
 * // → { allowed: false, retryAfterSeconds: 60 }
 */
export function createRateLimiter(
	bucket: string,
	options: RateLimiterOptions,
	store: RateLimitStore = databaseStore
): RateLimiter {
	const { max, windowMs } = options;
	if (!Number.isInteger(max) || max < 1) {
		throw new RangeError(`Rate limit max must be a positive integer, got ${max}`);
	}
	if (!(windowMs > 0)) {
		throw new RangeError(`Rate limit window must be positive, got ${windowMs} ms`);
	}

	/** The window holding `now`, and the weight of the previous window's hits at `now`. */
	function windowOf(now: number) {
		const start = Math.floor(now / windowMs) * windowMs;
		const elapsed = now - start;
		return { start, elapsed, weight: 1 - elapsed / windowMs };
	}

	function refused(prev: number, curr: number, elapsed: number): RateLimitResult {
		const wait = waitMs(prev, curr, max, windowMs, elapsed);
		return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil(wait / 1000)) };
	}

	async function judge(key: string, now: number, count: boolean): Promise<RateLimitResult> {
		const subject = subjectOf(key);
		const { start, elapsed, weight } = windowOf(now);
		const [prev, curr] = await store.read(bucket, subject, [start - windowMs, start]);
		// The previous window is closed, so its share is fixed; only the current counter races,
		// and the store's conditional increment settles that race.
		const below = Math.ceil(max - prev * weight);
		if (!count)
			return curr < below ? { allowed: true, retryAfterSeconds: 0 } : refused(prev, curr, elapsed);
		maybePrune(store, now);
		const counted = await store.increment(bucket, subject, start, below, start + 2 * windowMs);
		if (counted !== null) return { allowed: true, retryAfterSeconds: 0 };
		const [latest] = await store.read(bucket, subject, [start]);
		return refused(prev, Math.max(latest, below), elapsed);
	}

	return {
		consume: (key, now = Date.now()) => judge(key, now, true),
		peek: (key, now = Date.now()) => judge(key, now, false),
		reset: (key) => store.clear(bucket, key === undefined ? undefined : subjectOf(key)),
		release: (key, at) => store.decrement(bucket, subjectOf(key), windowOf(at).start)
	};
}
