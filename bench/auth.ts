/**
 * The account edge, part of `npm run bench`:
 * - The reset form for an address with an account and one without: the median answer time over
 *   20 tries of each, and their ratio (it should stay under 2×, so that the answer's time does
 *   not tell who has an account). Over HTTP against the built server (`node build`, when
 *   `build/` exists), and in-process for the action's own work (its limit, then queueing the
 *   reset; the form library cannot load outside Vite). Beside them, the same figures for the
 *   reset done before answering (`requestPasswordReset` awaited), the yardstick. Queued work is
 *   let finish between tries, so that each figure is the answer alone.
 * - One rate-limit hit counted in the database (SQLite file) against one counted in memory.
 * Runs on a fresh SQLite file and the local SMTP stand-in in a temporary folder.
 */
import { existsSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { resetConfig } from '../src/lib/server/config';
import { closeDb, openDb } from '../src/lib/server/db/index';
import { migrate } from '../src/lib/server/db/migrate';
import { configureAuthLimits, consumeReset } from '../src/lib/server/auth/limits';
import { signUp } from '../src/lib/server/auth/user';
import { queuePasswordReset, requestPasswordReset } from '../src/lib/server/auth/reset';
import {
	createRateLimiter,
	databaseStore,
	memoryStore,
	type RateLimiter
} from '../src/lib/server/auth/rate-limit';
import { jobsSettled } from '../src/lib/server/jobs';
import { stopMail } from '../src/lib/server/mail/index';
import { ROOT, startBuiltServer } from '../tests/integration/support/built-server';

const TRIES = 20;
const KNOWN = 'bench-owner@example.test';
const UNKNOWN = 'bench-nobody@example.test';

function median(values: number[]): number {
	const sorted = [...values].sort((a, b) => a - b);
	const mid = Math.floor(sorted.length / 2);
	return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** What the reset form's action does once it has read the form: count the try, queue the rest. */
async function resetAnswer(email: string): Promise<void> {
	const limit = await consumeReset('127.0.0.1', email);
	if (!limit.allowed) throw new Error('The bench ran into the reset limit.');
	queuePasswordReset(email);
}

/** The form posted to the built server over loopback; the answer must be its redirect. */
function postResetForm(origin: string) {
	return async (email: string) => {
		const res = await fetch(`${origin}/forgot-password`, {
			method: 'POST',
			headers: {
				'content-type': 'application/x-www-form-urlencoded',
				origin,
				accept: 'text/html'
			},
			body: new URLSearchParams({ email }).toString(),
			redirect: 'manual'
		});
		await res.arrayBuffer();
		if (res.status !== 303) throw new Error(`The reset form answered ${res.status}.`);
	};
}

interface Pair {
	known: number;
	unknown: number;
}

/**
 * Alternate known and unknown, so that drift in the machine's load hits both alike, and swap
 * which goes first each round: the try after a known one meets the database just written by its
 * queued reset (a token in another connection), and that must not always be the unknown one.
 */
async function timeBoth(
	once: (email: string) => Promise<unknown>,
	settle: () => Promise<unknown> = jobsSettled
): Promise<Pair> {
	const known: number[] = [];
	const unknown: number[] = [];
	for (let i = 0; i < TRIES + 2; i++) {
		const round = [
			[KNOWN, known],
			[UNKNOWN, unknown]
		] as const;
		for (const [email, into] of i % 2 ? [...round].reverse() : round) {
			const t0 = performance.now();
			await once(email);
			const ms = performance.now() - t0;
			await settle();
			if (i >= 2) into.push(ms); // two warm-up rounds
		}
	}
	return { known: median(known), unknown: median(unknown) };
}

/** Milliseconds per hit, median of three runs of `n` hits over 50 keys. */
async function perHit(limiter: RateLimiter, n: number): Promise<number> {
	const runs: number[] = [];
	for (let r = 0; r < 3; r++) {
		const t0 = performance.now();
		for (let i = 0; i < n; i++) await limiter.consume(`key-${i % 50}`);
		runs.push((performance.now() - t0) / n);
	}
	return median(runs);
}

export async function benchAuth(): Promise<string[]> {
	const dir = await mkdtemp(path.join(os.tmpdir(), 'twelvefold-bench-auth-'));
	process.env.DATA_DIR = dir;
	delete process.env.SMTP_URL;
	resetConfig();
	// The file name the built server opens in this folder (tests/integration/support).
	const db = openDb(`sqlite:${path.join(dir, 'test.sqlite')}`);
	try {
		await migrate(db);
		const huge = { max: 1_000_000, windowMs: 60 * 60_000 };
		await configureAuthLimits({ resetAddress: huge, resetEmail: huge });
		const made = await signUp({
			email: KNOWN,
			password: 'walking-bass-7',
			name: 'Bench',
			role: 'learner'
		});
		if (!made.ok) throw new Error(`bench account: ${made.message}`);

		// After the queue is empty the mail stand-in may still be writing the last mail away: a
		// short pause keeps that out of the next try's figure.
		const settle = async () => {
			await jobsSettled();
			await new Promise((resolve) => setTimeout(resolve, 100));
		};
		const inProcess = await timeBoth(resetAnswer, settle);
		const awaited = await timeBoth((email) => requestPasswordReset(email), settle);
		let http: Pair | null = null;
		if (existsSync(path.join(ROOT, 'build', 'index.js'))) {
			const server = await startBuiltServer(dir, { AUTH_LIMIT_SCALE: '1000000' });
			try {
				// The server's own queue is out of reach: a pause lets its mail go out between tries.
				const pause = () => new Promise((resolve) => setTimeout(resolve, 250));
				http = await timeBoth(postResetForm(server.origin), pause);
			} finally {
				await server.stop();
			}
		}

		const window = { max: 1_000_000, windowMs: 60_000 };
		const storedMs = await perHit(createRateLimiter('bench', window, databaseStore), 200);
		const memoryMs = await perHit(createRateLimiter('bench', window, memoryStore()), 2000);

		const f = (ms: number) => `${ms.toFixed(2)} ms`;
		const ratio = (t: Pair) =>
			`${(Math.max(t.known, t.unknown) / Math.min(t.known, t.unknown)).toFixed(2)}×`;
		const line = (label: string, t: Pair) =>
			`  ${label}: with an account ${f(t.known)}, without ${f(t.unknown)}; ratio ${ratio(t)}`;
		return [
			'',
			`Reset form answer, median of ${TRIES} tries each, an address with an account and one without (aim: ratio < 2×):`,
			http
				? line('POST /forgot-password to the built server', http)
				: '  POST /forgot-password to the built server: skipped (no build/; run `npx vite build` first)',
			line("the action's work in-process (limit, queue)", inProcess),
			line('yardstick, the reset done before answering', awaited),
			`Rate-limit hit: database (SQLite file) ${f(storedMs)}, memory ${(memoryMs * 1000).toFixed(1)} µs; ratio ${(storedMs / memoryMs).toFixed(0)}×`
		];
	} finally {
		await jobsSettled(10_000);
		await stopMail();
		await closeDb();
		await rm(dir, { recursive: true, force: true });
	}
}
