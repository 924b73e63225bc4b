import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { deleteAccount, setRole, signIn } from '../../../src/lib/server/auth/accounts';
import { createSession, validateSessionToken } from '../../../src/lib/server/auth/session';
import { closeDb, openDb } from '../../../src/lib/server/db/index';
import { migrate } from '../../../src/lib/server/db/migrate';
import { Session, User } from '../../../src/lib/server/db/models/index';
import { DEMO_ACCOUNTS, seedDemo } from '../../../src/lib/server/demo/seed';

/**
 * The same models and migrations on PostgreSQL, the way a school that outgrows one machine would
 * run them. `.ci/run` starts a local PostgreSQL server and sets TEST_POSTGRES_URL; without one
 * (a developer machine) this file is skipped.
 */
const url = process.env.TEST_POSTGRES_URL;

describe.skipIf(!url)('the data layer on PostgreSQL', () => {
	beforeAll(async () => {
		const db = openDb(url!);
		// A clean schema each run: the enum types of an earlier run would survive a dropTable.
		await db.query('DROP SCHEMA public CASCADE; CREATE SCHEMA public;');
	});
	afterAll(async () => {
		await closeDb();
	});

	it('runs every migration once, and a second run applies nothing', async () => {
		const db = openDb(url!);
		expect((await migrate(db)).length).toBeGreaterThan(0);
		expect(await migrate(db)).toEqual([]);
		expect(db.getDialect()).toBe('postgres');
	});

	it('seeds the demo accounts idempotently and signs them in', async () => {
		const first = await seedDemo('demo-password-12');
		expect(first.created.filter((entry) => entry.includes('@'))).toHaveLength(DEMO_ACCOUNTS.length);
		expect((await seedDemo('demo-password-12')).created).toEqual([]);
		const result = await signIn({ email: 'alto@example.com', password: 'demo-password-12' });
		expect(result.ok && result.user.settings.instrument).toBe('alto-sax');
		expect(await setRole(null, { email: 'guitar@example.com', role: 'teacher' })).toMatchObject({
			ok: true,
			changed: true
		});
	});

	it('stores only hashed session ids and cascades an account deletion to its sessions', async () => {
		const user = await User.findOne({ where: { email: 'trumpet@example.com' } });
		const { token } = await createSession(user!.id);
		expect(await Session.count({ where: { id: token } })).toBe(0);
		expect((await validateSessionToken(token)).user?.email).toBe('trumpet@example.com');
		expect(
			await deleteAccount(user!, {
				confirmEmail: 'trumpet@example.com',
				deletePassword: 'demo-password-12'
			})
		).toEqual({ ok: true });
		expect(await Session.count({ where: { userId: user!.id } })).toBe(0);
		expect(await User.count()).toBe(DEMO_ACCOUNTS.length - 1);
	});
});

describe.skipIf(!url)('class progress on PostgreSQL', () => {
	// Runs after the data-layer cases above in this file (one schema, one file: never two files
	// dropping it at once). The same scenario gives the same rows as on SQLite
	// (tests/integration/classes/progress.test.ts asserts the same `expectedRows` there).
	it('gives the same progress rows and heat map as SQLite', async () => {
		const db = openDb(url!);
		await migrate(db);
		const { buildScenario, comparable, expectedRows, SCENARIO_NOW } =
			await import('../classes/scenario');
		const { classProgress } = await import('../../../src/lib/server/classes/progress');
		const { learnerDetail } = await import('../../../src/lib/server/classes/learner');
		const scenario = await buildScenario();
		const rows = await classProgress(
			scenario.teacher,
			scenario.classId,
			{ sort: 'name' },
			SCENARIO_NOW
		);
		expect(rows.ok && comparable(rows.items)).toEqual(expectedRows);
		const map = await learnerDetail(scenario.teacher, scenario.classId, scenario.ada.id);
		if (!map.ok) throw new Error(map.message);
		expect(map.view.rows[0].cells[0]).toEqual({
			key: 'C',
			reviews: 10,
			recall: 1,
			tempo: 100,
			level: 'secure'
		});
		expect(map.view.log[0]).toEqual({
			day: '2026-03-10',
			reviews: 2,
			recalled: 1,
			licks: 2,
			minutes: 1
		});
	});
});
