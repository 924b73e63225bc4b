import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Op, QueryTypes } from 'sequelize';
import { migrate } from '../../../src/lib/server/db/migrate';
import { sqliteStorageOf } from '../../../src/lib/server/db/index';
import { EmailToken, Session, User } from '../../../src/lib/server/db/models/index';
import { settingsOf } from '../../../src/lib/server/study/settings';
import { openTestWorld, type TestWorld } from '../support/world';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
});
afterAll(() => world.close());

describe('the database layer', () => {
	test('sqlite URLs name a file or memory, other URLs are not sqlite', () => {
		expect(sqliteStorageOf('sqlite::memory:')).toBe(':memory:');
		expect(sqliteStorageOf('sqlite:/tmp/a.sqlite')).toBe('/tmp/a.sqlite');
		expect(sqliteStorageOf('sqlite:///tmp/b.sqlite')).toBe('/tmp/b.sqlite');
		expect(sqliteStorageOf('postgres://u@h/db')).toBeNull();
	});

	test('running the migrations again applies nothing', async () => {
		expect(await migrate(world.db)).toEqual([]);
		const tables = await world.db.getQueryInterface().showAllTables();
		expect(tables).toEqual(expect.arrayContaining(['email_tokens', 'sessions', 'users', 'cards']));
	});

	test('every connection, including those of transactions, has WAL, foreign keys and a busy timeout', async () => {
		const pragmas = async (transaction?: import('sequelize').Transaction) => {
			const [fk] = await world.db.query<{ foreign_keys: number }>('PRAGMA foreign_keys', {
				type: QueryTypes.SELECT,
				transaction
			});
			const [journal] = await world.db.query<{ journal_mode: string }>('PRAGMA journal_mode', {
				type: QueryTypes.SELECT,
				transaction
			});
			const [busy] = await world.db.query<{ timeout: number }>('PRAGMA busy_timeout', {
				type: QueryTypes.SELECT,
				transaction
			});
			return { fk: fk.foreign_keys, journal: journal.journal_mode, busy: busy.timeout };
		};
		const expected = { fk: 1, journal: 'wal', busy: 5000 };
		expect(await pragmas()).toEqual(expected);
		expect(await world.db.transaction((t) => pragmas(t))).toEqual(expected);
	});

	test('thirty concurrent write transactions all commit: each waits for the lock instead of failing busy', async () => {
		const results = await Promise.allSettled(
			Array.from({ length: 30 }, (_, i) =>
				world.db.transaction(async (transaction) => {
					const user = await User.create(
						{ email: `writer${i}@case.test`, name: `W${i}`, passwordHash: 'x' },
						{ transaction }
					);
					// A read then a write in one transaction: the pattern that fails under DEFERRED.
					await User.count({ transaction });
					user.name = `Writer ${i}`;
					await user.save({ transaction });
				})
			)
		);
		expect(results.filter((r) => r.status === 'rejected')).toEqual([]);
		expect(await User.count({ where: { name: { [Op.like]: 'Writer %' } } })).toBe(30);
	});

	test('plain writes interleaved with transactions all land', async () => {
		const work = Array.from({ length: 20 }, (_, i) =>
			i % 2
				? User.create({ email: `plain${i}@case.test`, name: 'Plain', passwordHash: 'x' })
				: world.db.transaction((transaction) =>
						User.create(
							{ email: `plain${i}@case.test`, name: 'Plain', passwordHash: 'x' },
							{ transaction }
						)
					)
		);
		await Promise.all(work);
		expect(await User.count({ where: { name: 'Plain' } })).toBe(20);
	});

	test('a transaction opened inside another is refused at once instead of deadlocking', async () => {
		await expect(world.db.transaction(() => world.db.transaction(async () => 1))).rejects.toThrow(
			/inside another one/
		);
		// The queue is free again afterwards.
		expect(await world.db.transaction(async () => 'free')).toBe('free');
	});

	test('an unmanaged transaction is refused: the queue must see every transaction end', async () => {
		await expect(world.db.transaction()).rejects.toThrow(/Pass a callback/);
	});

	test('e-mail addresses are stored lower-cased and must be unique', async () => {
		const user = await User.create({ email: ' Mixed@Case.TEST ', name: 'M', passwordHash: 'x' });
		expect(user.email).toBe('mixed@case.test');
		await expect(
			User.create({ email: 'MIXED@case.test', name: 'N', passwordHash: 'y' })
		).rejects.toThrow();
	});

	test('deleting a user cascades to their sessions and tokens', async () => {
		const user = await User.create({ email: 'gone@case.test', name: 'G', passwordHash: 'x' });
		const later = new Date(Date.now() + 60_000);
		await Session.create({ id: 'a'.repeat(64), userId: user.id, expiresAt: later });
		await EmailToken.create({
			id: 'b'.repeat(64),
			userId: user.id,
			purpose: 'verify',
			expiresAt: later
		});
		await user.destroy();
		expect(await Session.count({ where: { userId: user.id } })).toBe(0);
		expect(await EmailToken.count({ where: { userId: user.id } })).toBe(0);
	});

	test('a session for a user who does not exist is refused by the foreign key', async () => {
		await expect(
			Session.create({
				id: 'c'.repeat(64),
				userId: '00000000-0000-4000-8000-000000000000',
				expiresAt: new Date()
			})
		).rejects.toThrow(/FOREIGN KEY/);
	});

	test('settings come back with defaults filled in and bad stored values replaced', async () => {
		const user = await User.create({
			email: 'settings@case.test',
			name: 'S',
			passwordHash: 'x',
			digestHour: 21,
			settings: { instrument: 'kazoo!', dailyMinutes: 30 }
		});
		const again = await User.findByPk(user.id);
		expect(settingsOf(again!)).toEqual({
			timezone: 'UTC',
			instrument: 'concert',
			digestHour: 21,
			digestEnabled: true,
			desiredRetention: 0.9,
			dailyMinutes: 30,
			keyOrder: 'weighted',
			dayStartHour: 4,
			newPerDay: 5
		});
	});
});
