/**
 * The scheduled-mail benchmark, run by `npm run bench` in a process of its own (so that its peak
 * memory is its own): N learners (BENCH_DIGEST_LEARNERS, default 10 000) in a fresh SQLite file,
 * each with three reviews due, two new licks and a week of history, all at their reminder hour.
 * One run of the scheduler composes and hands every reminder to the local SMTP stand-in through
 * the pooled transport. The yardstick, measured in the same process: the same number of one
 * ready-made mail handed to the same server through the same pool (the cost of SMTP alone).
 * Prints one JSON line.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { resetConfig } from '../src/lib/server/config';
import { closeDb, openDb } from '../src/lib/server/db/index';
import { migrate } from '../src/lib/server/db/migrate';
import { openBulkMailer, stopMail } from '../src/lib/server/mail/index';
import { runScheduledMail } from '../src/lib/server/digest/send';

const learners = Number(process.env.BENCH_DIGEST_LEARNERS || 10_000);
const now = new Date('2026-03-02T20:00:00Z');
const zones = ['UTC', 'Europe/Berlin', 'Europe/Lisbon', 'America/New_York', 'America/Los_Angeles'];

const dir = await mkdtemp(path.join(os.tmpdir(), 'twelvefold-bench-digest-'));
process.env.DATA_DIR = dir;
process.env.PUBLIC_BASE_URL = 'https://twelvefold.test';
delete process.env.SMTP_URL;
resetConfig();
const db = openDb(`sqlite:${path.join(dir, 'bench.sqlite')}`);
await migrate(db);

/** Insert rows in chunks of multi-row INSERTs, inside one transaction. */
async function insertRows(table: string, rows: Record<string, unknown>[]): Promise<void> {
	if (rows.length === 0) return;
	const columns = Object.keys(rows[0]);
	await db.transaction(async (transaction) => {
		for (let i = 0; i < rows.length; i += 400) {
			const chunk = rows.slice(i, i + 400);
			const replacements: unknown[] = [];
			const values = chunk.map((row) => {
				for (const c of columns) replacements.push(row[c]);
				return `(${columns.map(() => '?').join(', ')})`;
			});
			await db.query(`INSERT INTO ${table} (${columns.join(', ')}) VALUES ${values.join(', ')}`, {
				replacements,
				type: QueryTypes.INSERT,
				transaction
			});
		}
	});
}

const t0 = performance.now();
const created = new Date('2026-01-01T00:00:00Z');
const authorId = randomUUID();
const user = (id: string, i: number, extra: Record<string, unknown> = {}) => ({
	id,
	email: `learner${i}@example.com`,
	name: `Learner ${i}`,
	role: 'learner',
	password_hash: 'x',
	email_verified_at: created,
	settings: '{}',
	timezone: zones[Math.abs(i) % zones.length],
	digest_hour: 7,
	digest_enabled: true,
	day_start_hour: 4,
	created_at: created,
	updated_at: created,
	...extra
});
await insertRows('users', [
	user(authorId, -1, { email: 'author@example.com', role: 'teacher', digest_enabled: false })
]);
const lickIds = Array.from({ length: 10 }, () => randomUUID());
await insertRows(
	'licks',
	lickIds.map((id, i) => ({
		id,
		author_id: authorId,
		title: `Lick ${i}`,
		abc: 'X:1\nK:C\nCDEF|',
		home_key: 'C',
		home_quality: '7',
		tempo: 120,
		created_at: created,
		updated_at: created
	}))
);
const keys = ['C', 'F', 'Bb', 'Eb', 'Ab', 'Db', 'Gb'];
for (let start = 0; start < learners; start += 1000) {
	const users: Record<string, unknown>[] = [];
	const cards: Record<string, unknown>[] = [];
	const reviews: Record<string, unknown>[] = [];
	for (let i = start; i < Math.min(learners, start + 1000); i++) {
		const id = randomUUID();
		users.push(user(id, i));
		for (let c = 0; c < 5; c++) {
			const cardId = randomUUID();
			const learned = c < 3;
			cards.push({
				id: cardId,
				user_id: id,
				lick_id: lickIds[(i + c) % lickIds.length],
				quality: '7',
				due: learned ? new Date('2026-03-01T12:00:00Z') : created,
				state: learned ? 2 : 0,
				stability: learned ? 5 : 0,
				difficulty: learned ? 5 : 0,
				reps: learned ? 3 : 0,
				last_review: learned ? new Date('2026-02-25T12:00:00Z') : null,
				introduced_day: learned ? '2026-02-20' : null,
				new_position: c,
				created_at: created,
				updated_at: created
			});
			if (learned) {
				for (let d = 0; d < 2; d++) {
					reviews.push({
						id: randomUUID(),
						card_id: cardId,
						user_id: id,
						lick_id: lickIds[(i + c) % lickIds.length],
						client_id: randomUUID(),
						reviewed_at: new Date(`2026-02-2${5 + d}T12:00:00Z`),
						day: `2026-02-2${5 + d}`,
						grade: 1 + ((i + c + d) % 4),
						key: keys[(i + c + d) % keys.length],
						quality: '7',
						reveal_ms: 20_000 + (i % 7) * 1000,
						grade_ms: 3_000,
						state_before: '{}',
						state_after: '{}',
						created_at: created
					});
				}
			}
		}
	}
	await insertRows('users', users);
	await insertRows('cards', cards);
	await insertRows('reviews', reviews);
}
const setupMs = performance.now() - t0;

// Peak resident memory during each phase, sampled, since the high-water mark of the whole
// process would include the setup.
function sampleMemory(): { stop(): number } {
	let peak = process.memoryUsage().rss;
	const timer = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 20);
	return {
		stop() {
			clearInterval(timer);
			return Math.max(peak, process.memoryUsage().rss);
		}
	};
}

const mailer = await openBulkMailer();
// The yardstick: the same number of one ready-made mail through the same pool.
const sample = {
	to: 'someone@example.com',
	subject: 'Today: 5 licks, about 4 minutes',
	text: 'Hello,\n\n'.padEnd(2_000, 'x'),
	html: '<p>Hello,</p>'.padEnd(9_000, 'x')
};
const rssBefore = process.memoryUsage().rss;
let memory = sampleMemory();
let t = performance.now();
const inFlight: Promise<void>[] = [];
for (let i = 0; i < learners; i++) {
	inFlight.push(mailer.send({ ...sample, to: `learner${i}@example.com` }));
	if (inFlight.length >= 4) await inFlight.shift();
}
await Promise.all(inFlight);
const handoverMs = performance.now() - t;
const handoverPeak = memory.stop();

memory = sampleMemory();
t = performance.now();
const report = await runScheduledMail({ now, mailer, log: () => {} });
const digestMs = performance.now() - t;
const digestPeak = memory.stop();

mailer.close();
await stopMail();
await closeDb();
await rm(dir, { recursive: true, force: true });

console.log(
	JSON.stringify({
		learners,
		sent: report.sent,
		failed: report.failed,
		setupMs,
		digestMs,
		handoverMs,
		rssBeforeMb: rssBefore / 2 ** 20,
		digestPeakMb: digestPeak / 2 ** 20,
		handoverPeakMb: handoverPeak / 2 ** 20
	})
);
