import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Op, QueryTypes } from 'sequelize';
import { issueToken } from '../../../src/lib/server/auth/email-token';
import { closeDb, getDb, openDb } from '../../../src/lib/server/db/index';
import { migrate } from '../../../src/lib/server/db/migrate';
import { EmailToken, User } from '../../../src/lib/server/db/models/index';
import { openTestWorld, type TestWorld } from '../support/world';

/**
 * Rules that must hold with several writers at once rest on the database: checked here with 50
 * concurrent writers on SQLite and, when TEST_POSTGRES_URL is set, on PostgreSQL.
 */
const WRITERS = 50;
const NOW = new Date('2026-03-01T12:00:00Z');

async function rulesHold(dialect: string) {
	const user = await User.create({
		email: `race-${dialect}@constraints.test`,
		name: 'Racer',
		passwordHash: 'x'
	});
	// Fifty "mail me a link" at once: every one answers, exactly one link stays live.
	const tokens = await Promise.all(
		Array.from({ length: WRITERS }, () => issueToken(user.id, 'reset', NOW))
	);
	expect(new Set(tokens).size).toBe(WRITERS);
	expect(await EmailToken.count({ where: { userId: user.id, usedAt: null } })).toBe(1);
	expect(await EmailToken.count({ where: { userId: user.id } })).toBe(WRITERS);

	// Fifty sign-ups with one address at once: the unique index lets one through.
	const outcomes = await Promise.allSettled(
		Array.from({ length: WRITERS }, (_, i) =>
			User.create({
				email: `same-${dialect}@constraints.test`,
				name: `Twin ${i}`,
				passwordHash: 'x'
			})
		)
	);
	expect(outcomes.filter((o) => o.status === 'fulfilled')).toHaveLength(1);
	expect(
		outcomes
			.filter((o): o is PromiseRejectedResult => o.status === 'rejected')
			.every((o) => o.reason.name === 'SequelizeUniqueConstraintError')
	).toBe(true);
	expect(await User.count({ where: { email: { [Op.like]: `same-${dialect}@%` } } })).toBe(1);
}

describe('on SQLite', () => {
	let world: TestWorld;
	beforeAll(async () => {
		world = await openTestWorld();
	});
	afterAll(() => world.close());

	test('a live link and an address stay unique under 50 concurrent writers', async () => {
		await rulesHold('sqlite');
	});

	test('a role or a link purpose outside its set is refused by a CHECK, not only by the model', async () => {
		const insert = (role: string) =>
			world.db.query(
				`INSERT INTO users (id, email, name, role, password_hash, settings, created_at, updated_at)
				 VALUES (:id, :email, 'C', :role, 'x', '{}', :now, :now)`,
				{
					replacements: {
						id: crypto.randomUUID(),
						email: `${role}@check.test`,
						role,
						now: NOW.toISOString()
					}
				}
			);
		await expect(insert('superuser')).rejects.toMatchObject({
			parent: { message: expect.stringMatching(/CHECK constraint failed/) }
		});
		await expect(insert('teacher')).resolves.toBeDefined();
		const [column] = await world.db.query<{ type: string }>(
			"SELECT type FROM pragma_table_info('users') WHERE name = 'role'",
			{ type: QueryTypes.SELECT }
		);
		expect(column.type).toBe('VARCHAR(16)');
	});

	test('a query inside a transaction that forgets { transaction } is caught at once', async () => {
		await expect(
			world.db.transaction(async () => {
				await User.count();
			})
		).rejects.toThrow(/without \{ transaction \}/);
	});
});

const url = process.env.TEST_POSTGRES_URL;

describe.skipIf(!url)('on PostgreSQL', () => {
	beforeAll(async () => {
		const db = openDb(url!);
		await db.query('DROP SCHEMA public CASCADE; CREATE SCHEMA public;');
		await migrate(db);
	});
	afterAll(() => closeDb());

	test('a live link and an address stay unique under 50 concurrent writers', async () => {
		await rulesHold('postgres');
	});

	test('roles are strings with a CHECK: no enum type is left', async () => {
		const db = getDb();
		const types = await db.query("SELECT typname FROM pg_type WHERE typname LIKE 'enum_%'", {
			type: QueryTypes.SELECT
		});
		expect(types).toEqual([]);
		await expect(
			db.query("UPDATE users SET role = 'superuser' WHERE email LIKE 'race-%'")
		).rejects.toThrow(/check constraint/);
	});
});
