import { spawn } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openTestWorld, type TestWorld } from '../support/world';
import { resetConfig } from '../../../src/lib/server/config';
import { closeDb, openDb } from '../../../src/lib/server/db/index';
import { migrate } from '../../../src/lib/server/db/migrate';
import { MailSend } from '../../../src/lib/server/db/models/index';
import { stopMail } from '../../../src/lib/server/mail/index';
import { runScheduledMail } from '../../../src/lib/server/digest/send';
import { makeCard, makeLick, makeUser, readOutbox, recipientsOf } from './fixtures';

/**
 * Exactly one reminder per person and practice day: a second run, a restart, two processes
 * started together on one SQLite file, and the same on PostgreSQL. The claim is the unique
 * (user, kind, day) row of `mail_sends`, inserted in the transaction that decides to send.
 */

const root = path.resolve(import.meta.dirname, '../../..');
const now = new Date('2026-03-02T08:00:00Z');

/** Learners with something due at `now`, plus one with nothing; returns the due ones' addresses. */
async function makeLearners(count: number, prefix: string): Promise<string[]> {
	const author = await makeUser({ email: `${prefix}-author@example.com`, digestHour: 23 });
	const lick = await makeLick(author.id, 'Blue turn');
	await makeUser({ email: `${prefix}-idle@example.com` });
	const emails: string[] = [];
	for (let i = 0; i < count; i++) {
		const email = `${prefix}-${i}@example.com`;
		const who = await makeUser({ email });
		await makeCard(who.id, lick.id, { state: 2, due: new Date('2026-03-01T00:00:00Z') });
		emails.push(email);
	}
	return emails;
}

/** `npm run digest -- --now …` in a child process against the given database and data folder. */
function runDigestProcess(env: Record<string, string>): Promise<{ code: number; out: string }> {
	return new Promise((resolve, reject) => {
		const child = spawn(
			process.execPath,
			['--import', 'tsx', 'scripts/digest.ts', '--now', now.toISOString()],
			{
				cwd: root,
				env: { ...process.env, SMTP_URL: '', ...env },
				stdio: ['ignore', 'pipe', 'pipe']
			}
		);
		let out = '';
		child.stdout.on('data', (chunk) => (out += chunk));
		child.stderr.on('data', (chunk) => (out += chunk));
		child.on('error', reject);
		child.on('exit', (code) => resolve({ code: code ?? -1, out }));
	});
}

function countBy(list: string[]): Map<string, number> {
	const counts = new Map<string, number>();
	for (const item of list) counts.set(item, (counts.get(item) ?? 0) + 1);
	return counts;
}

describe('one reminder per person and day, in one process', () => {
	let world: TestWorld;
	let emails: string[];
	beforeAll(async () => {
		world = await openTestWorld();
		emails = await makeLearners(3, 'one');
	});
	afterAll(() => world.close());

	it('sends each due learner one mail, and a second run the same local day sends none', async () => {
		const first = await runScheduledMail({ now, log: () => {} });
		// The author's hour (23:00) has not come; the idle learner has nothing to read.
		expect(first).toMatchObject({ sent: 3, skipped: 1, failed: 0 });
		const later = new Date(now.getTime() + 3 * 60 * 60 * 1000);
		const second = await runScheduledMail({ now: later, log: () => {} });
		expect(second).toMatchObject({ sent: 0, skipped: 0, failed: 0, taken: 0 });
		const mails = await readOutbox(world.dataDir);
		expect(mails.flatMap(recipientsOf).sort()).toEqual([...emails].sort());
	});

	it('sends none after a restart either: the claims are in the database', async () => {
		const url = `sqlite:${path.join(world.dataDir, 'test.sqlite')}`;
		await stopMail();
		await closeDb();
		openDb(url);
		const report = await runScheduledMail({ now: new Date(now.getTime() + 60_000), log: () => {} });
		expect(report.sent).toBe(0);
		expect(await MailSend.count({ where: { status: 'sent' } })).toBe(3);
	});

	it('retries a failed send later, with back-off, and then sends it once', async () => {
		const failing = {
			send: async () => Promise.reject(new Error('421 try again later')),
			close() {}
		};
		const tomorrow = new Date('2026-03-03T08:00:00Z');
		const logged: string[] = [];
		const failed = await runScheduledMail({
			now: tomorrow,
			mailer: failing,
			log: (l) => logged.push(l)
		});
		expect(failed).toMatchObject({ sent: 0, failed: 3 });
		expect(logged[0]).toMatch(
			/digest to one-\d@example\.com for 2026-03-03 failed \(attempt 1\): 421 try again later; next try at 2026-03-03T08:02:00\.000Z/
		);
		// Too early for the retry: nothing happens.
		expect(
			await runScheduledMail({ now: new Date(tomorrow.getTime() + 60_000), log: () => {} })
		).toMatchObject({ sent: 0, retried: 0 });
		const retried = await runScheduledMail({
			now: new Date(tomorrow.getTime() + 2 * 60_000),
			log: () => {}
		});
		expect(retried).toMatchObject({ sent: 3, retried: 3, failed: 0 });
		const rows = await MailSend.findAll({ where: { day: '2026-03-03', status: 'sent' } });
		expect(rows.map((r) => r.attempts)).toEqual([2, 2, 2]);
		const again = await runScheduledMail({
			now: new Date(tomorrow.getTime() + 60 * 60_000),
			log: () => {}
		});
		expect(again).toMatchObject({ sent: 0, retried: 0 });
	});
});

describe('two processes started together on one SQLite file', () => {
	let world: TestWorld;
	let emails: string[];
	beforeAll(async () => {
		world = await openTestWorld();
		emails = await makeLearners(20, 'two');
	});
	afterAll(() => world.close());

	it('send each learner exactly one mail between them', async () => {
		const env = {
			DATA_DIR: world.dataDir,
			DATABASE_URL: `sqlite:${path.join(world.dataDir, 'test.sqlite')}`
		};
		const [a, b] = await Promise.all([runDigestProcess(env), runDigestProcess(env)]);
		expect([a.code, b.code], a.out + b.out).toEqual([0, 0]);
		const mails = await readOutbox(world.dataDir);
		const counts = countBy(mails.flatMap(recipientsOf));
		expect([...counts.keys()].sort()).toEqual([...emails].sort());
		expect([...counts.values()].every((n) => n === 1)).toBe(true);
		expect(await MailSend.count({ where: { status: 'sent' } })).toBe(20);
	}, 120_000);
});

const postgresUrl = process.env.TEST_POSTGRES_URL;

describe.skipIf(!postgresUrl)('on PostgreSQL', () => {
	// A database of its own (.ci/postgres.sh makes it), so that this file and the data-layer test,
	// which empties the shared database's schema, can run side by side.
	const url = postgresUrl?.replace(/\/([^/?]+)(\?|$)/, '/$1_digest$2') ?? '';
	let dataDir: string;
	let emails: string[];
	beforeAll(async () => {
		dataDir = await mkdtemp(path.join(os.tmpdir(), 'twelvefold-digest-pg-'));
		process.env.DATA_DIR = dataDir;
		process.env.PUBLIC_BASE_URL = 'http://twelvefold.test';
		delete process.env.SMTP_URL;
		resetConfig();
		const db = openDb(url);
		await db.query('DROP SCHEMA public CASCADE; CREATE SCHEMA public;');
		await migrate(db);
		emails = await makeLearners(20, 'pg');
	});
	afterAll(async () => {
		await stopMail();
		await closeDb();
		await rm(dataDir, { recursive: true, force: true });
	});

	it('two runs at once and two processes at once still send one mail per learner', async () => {
		const [first, second] = await Promise.all([
			runScheduledMail({ now, log: () => {} }),
			runScheduledMail({ now, log: () => {} })
		]);
		expect(first.sent + second.sent).toBe(20);
		expect(first.taken + second.taken).toBeGreaterThanOrEqual(0);
		const env = { DATA_DIR: dataDir, DATABASE_URL: url };
		const [a, b] = await Promise.all([runDigestProcess(env), runDigestProcess(env)]);
		expect([a.code, b.code], a.out + b.out).toEqual([0, 0]);
		expect(a.out).toContain(': 0 sent');
		expect(b.out).toContain(': 0 sent');
		const counts = countBy((await readOutbox(dataDir)).flatMap(recipientsOf));
		expect([...counts.keys()].sort()).toEqual([...emails].sort());
		expect([...counts.values()].every((n) => n === 1)).toBe(true);
	}, 120_000);
});
