/**
 * The drill's figures for `npm run bench`:
 * 1. building today's queue for a learner with 5,000 cards: the pure `buildQueue` alone, and the
 *    whole `GET /api/drill/today` service (database reads, key picks, notation rendered);
 * 2. `POST /api/drill/reviews` throughput and p99 under autocannon on loopback against the built
 *    server, beside the same write in a bare node:http + sqlite3 handler measured in the same
 *    run, as a ratio.
 * Needs `build/` (run `npx vite build` first); without it part 2 says so and is skipped.
 */
import { fork, spawn, type ChildProcess } from 'node:child_process';
import { copyFileSync, existsSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import autocannon from 'autocannon';
import { resetConfig } from '../src/lib/server/config';
import { closeDb, openDb } from '../src/lib/server/db/index';
import { migrate } from '../src/lib/server/db/migrate';
import { Card, Lick, User } from '../src/lib/server/db/models/index';
import { createSession, SESSION_COOKIE_NAME } from '../src/lib/server/auth/session';
import { normalizeSettings } from '../src/lib/practice/settings';
import { settingsOf, toSettingsColumns } from '../src/lib/server/study/settings';
import { buildToday } from '../src/lib/server/study/today';
import { configureEngineBudget } from '../src/lib/server/music/render';
import { buildQueue, type QueueCard } from '../src/lib/practice/queue';
import { dayBounds, practiceDay } from '../src/lib/practice/day';
import { DEMO_LICKS } from '../src/lib/demo/licks';
import { freePort, ROOT } from '../tests/integration/support/built-server';

const CARDS = 5000;
const QUALITIES = ['7', 'm7', 'maj7', 'm7b5', '7alt', '6', 'm6', 'dim7', '7sus4'];
const DAY = 86_400_000;

function median(xs: number[]): number {
	const s = [...xs].sort((a, b) => a - b);
	return s[Math.floor(s.length / 2)];
}

const dataDir = mkdtempSync(path.join(os.tmpdir(), 'twelvefold-bench-'));
process.env.DATA_DIR = dataDir;
delete process.env.DATABASE_URL;
process.env.SMTP_URL = '';
resetConfig();
const dbFile = path.join(dataDir, 'twelvefold.sqlite');
const db = openDb(`sqlite:${dbFile}`);
await migrate(db);

// A learner with 5,000 cards: 560 licks (our demo lines under other titles) × 9 qualities,
// about a third of them due today, a third later, a third new.
const now = new Date();
const learner = await User.create({
	email: 'bench@example.test',
	name: 'Bench Learner',
	passwordHash: 'x',
	emailVerifiedAt: now,
	...toSettingsColumns(normalizeSettings({}))
});
const lickCount = Math.ceil(CARDS / QUALITIES.length);
const licks = await Lick.bulkCreate(
	Array.from({ length: lickCount }, (_, i) => {
		const demo = DEMO_LICKS[i % DEMO_LICKS.length];
		return {
			authorId: learner.id,
			title: `${demo.title} ${i}`,
			abc: demo.abc,
			homeKey: 'C',
			homeQuality: '7',
			tempo: 140
		};
	})
);
const cardRows = [];
for (let i = 0; i < CARDS; i++) {
	const kind = i % 3;
	const last = new Date(now.getTime() - (5 + (i % 40)) * DAY);
	cardRows.push({
		userId: learner.id,
		lickId: licks[Math.floor(i / QUALITIES.length)].id,
		quality: QUALITIES[i % QUALITIES.length],
		newPosition: i,
		due:
			kind === 0
				? new Date(now.getTime() - (i % 9) * DAY)
				: kind === 1
					? new Date(now.getTime() + (1 + (i % 30)) * DAY)
					: now,
		state: kind === 2 ? 0 : 2,
		stability: kind === 2 ? 0 : 2 + (i % 50),
		difficulty: kind === 2 ? 0 : 5,
		reps: kind === 2 ? 0 : 4,
		lastReview: kind === 2 ? null : last,
		introducedDay: kind === 2 ? null : '2026-01-01',
		scheduledDays: kind === 2 ? 0 : 5
	});
}
await Card.bulkCreate(cardRows);

// 1a. The pure queue over 5,000 cards.
const day = practiceDay(now, 'UTC', 4);
const queueCards: QueueCard[] = (await Card.findAll({ where: { userId: learner.id } })).map(
	(c) => ({
		id: c.id,
		lickId: c.lickId,
		assignmentId: null,
		newPosition: c.newPosition,
		introducedDay: c.introducedDay,
		retired: false,
		due: c.due,
		stability: c.stability,
		difficulty: c.difficulty,
		scheduledDays: c.scheduledDays,
		learningSteps: c.learningSteps,
		reps: c.reps,
		lapses: c.lapses,
		state: c.state,
		lastReview: c.lastReview
	})
);
const pureTimes: number[] = [];
for (let i = 0; i < 30; i++) {
	const t0 = performance.now();
	buildQueue({
		now,
		day,
		dayEnd: dayBounds(day, 'UTC', 4).end,
		cards: queueCards,
		sources: new Map(),
		ownSource: { newPerDay: 5, active: true },
		introducedToday: new Map(),
		licksIntroducedToday: new Set(),
		dailyMinutes: 15,
		secondsPerCard: 45
	});
	pureTimes.push(performance.now() - t0);
}

// 1b. The whole service, as GET /api/drill/today runs it (the engine's global budget lifted:
// this measures the work, not the guard).
configureEngineBudget(60_000);
const actor = { id: learner.id, settings: settingsOf(learner) };
let itemCount = 0;
const serviceTimes: number[] = [];
for (let i = 0; i < 8; i++) {
	const t0 = performance.now();
	const today = await buildToday(actor, now);
	serviceTimes.push(performance.now() - t0);
	itemCount = today.items.length;
}

const lines = [
	'',
	`Drill: today's queue for a learner with ${CARDS} cards (${itemCount} prompts rendered)`,
	`  buildQueue (pure, ordering by retrievability):   ${median(pureTimes).toFixed(2)} ms`,
	`  buildToday (database + keys + notation):         ${median(serviceTimes).toFixed(1)} ms`
];

// 2. POST /api/drill/reviews under autocannon, beside a bare handler doing the same write.
const cardIds = queueCards.map((c) => c.id);
const cardQuality = new Map(
	(await Card.findAll({ attributes: ['id', 'quality'] })).map((c) => [c.id, c.quality])
);
const { token } = await createSession(learner.id);
await closeDb();

/** Seconds each server is loaded before the measured run, and of the measured run. */
const WARM_UP_S = 3;
const MEASURE_S = 8;

let n = 0;
async function hammer(port: number, headers: Record<string, string>, duration = MEASURE_S) {
	const result = await autocannon({
		url: `http://127.0.0.1:${port}/api/drill/reviews`,
		method: 'POST',
		connections: 20,
		duration,
		timeout: 30,
		headers: { 'content-type': 'application/json', ...headers },
		requests: [
			{
				setupRequest: (req) => {
					const cardId = cardIds[n++ % cardIds.length];
					return {
						...req,
						body: JSON.stringify({
							cardId,
							key: 'Eb',
							quality: cardQuality.get(cardId),
							grade: 3,
							clientId: randomUUID(),
							revealMs: 20000,
							gradeMs: 2000
						})
					};
				}
			}
		]
	});
	return {
		rps: result.requests.average,
		p99: result.latency.p99,
		ok: result['2xx'],
		other: result.non2xx + result.errors
	};
}

function waitFor(port: number, pathName: string, status: number): Promise<void> {
	return new Promise((resolve, reject) => {
		const deadline = Date.now() + 30_000;
		const tryOnce = async () => {
			try {
				const res = await fetch(`http://127.0.0.1:${port}${pathName}`);
				if (res.status === status) return resolve();
			} catch {
				// not yet
			}
			if (Date.now() > deadline) return reject(new Error(`no answer on :${port}`));
			setTimeout(tryOnce, 100);
		};
		void tryOnce();
	});
}

function stop(child: ChildProcess): Promise<void> {
	return new Promise((resolve) => {
		if (child.exitCode !== null) return resolve();
		child.once('exit', () => resolve());
		child.kill('SIGTERM');
	});
}

if (!existsSync(path.join(ROOT, 'build', 'index.js'))) {
	lines.push('  POST /api/drill/reviews: skipped, no build/ (run `npx vite build` first)');
} else {
	// Same data for both: the bare handler gets its own copy of the file.
	const bareFile = path.join(dataDir, 'bare.sqlite');
	copyFileSync(dbFile, bareFile);
	for (const ext of ['-wal', '-shm'])
		if (existsSync(dbFile + ext)) copyFileSync(dbFile + ext, bareFile + ext);

	const appPort = await freePort();
	// BENCH_CPU_PROF=<dir> writes a V8 CPU profile of the server (on a clean exit) for reading.
	const profile = process.env.BENCH_CPU_PROF
		? ['--cpu-prof', `--cpu-prof-dir=${path.resolve(process.env.BENCH_CPU_PROF)}`]
		: [];
	const app = spawn(process.execPath, [...profile, 'build'], {
		cwd: ROOT,
		// Its log is kept and shown only when no write succeeded (stopping it mid-request logs
		// the requests cut off).
		stdio: ['ignore', 'ignore', 'pipe'],
		env: {
			...process.env,
			PORT: String(appPort),
			HOST: '127.0.0.1',
			ORIGIN: `http://127.0.0.1:${appPort}`,
			DATA_DIR: dataDir,
			DATABASE_URL: `sqlite:${dbFile}`,
			NODE_ENV: 'production'
		}
	});
	let appLog = '';
	app.stderr?.on('data', (chunk) => (appLog += chunk));
	await waitFor(appPort, '/api/me', 401);
	// A server just started loads its route modules and compiles its hot paths on the first
	// requests: both servers are warmed up alike before the measured run.
	const session = { cookie: `${SESSION_COOKIE_NAME}=${token}` };
	await hammer(appPort, session, WARM_UP_S);
	const ours = await hammer(appPort, session);
	await stop(app);
	if (ours.ok === 0) console.error(appLog.slice(0, 4000));

	const barePort = await freePort();
	const bare = fork(path.join(ROOT, 'bench', 'bare-review-server.mjs'), [], {
		env: { ...process.env, DB_FILE: bareFile, PORT: String(barePort) },
		stdio: ['ignore', 'ignore', 'inherit', 'ipc']
	});
	await new Promise((resolve) => bare.once('message', resolve));
	await hammer(barePort, { 'x-user': learner.id }, WARM_UP_S);
	const yardstick = await hammer(barePort, { 'x-user': learner.id });
	await stop(bare);

	lines.push(
		`POST /api/drill/reviews, autocannon 20 connections × ${MEASURE_S} s on loopback (after ${WARM_UP_S} s of warm-up):`,
		`  Twelvefold (built server):        ${ours.rps.toFixed(0)} req/s, p99 ${ours.p99} ms  (${ours.ok} 2xx, ${ours.other} other)`,
		`  bare node:http + sqlite3 write:   ${yardstick.rps.toFixed(0)} req/s, p99 ${yardstick.p99} ms  (${yardstick.ok} 2xx, ${yardstick.other} other)`,
		`  Ratio throughput ours / bare:     ${(ours.rps / yardstick.rps).toFixed(2)}×   p99 ours / bare: ${(ours.p99 / Math.max(1, yardstick.p99)).toFixed(2)}×`
	);
}

console.log(lines.join('\n'));
rmSync(dataDir, { recursive: true, force: true });
