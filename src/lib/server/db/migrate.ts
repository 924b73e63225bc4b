import { randomUUID } from 'node:crypto';
import { Umzug, type UmzugStorage } from 'umzug';
import {
	QueryTypes,
	UniqueConstraintError,
	type QueryInterface,
	type Sequelize,
	type Transaction
} from 'sequelize';
import { getDb } from './index';
import { migrations } from './migrations/index';

/**
 * The migration runner. Each migration runs in one transaction together with the row that records
 * it in `schema_migrations`, so a failure leaves neither half. Processes that start together take
 * turns through a lock row (`schema_lock`, a primary key insert that only one of them wins, on
 * SQLite and PostgreSQL alike); the others wait, then find nothing left to apply.
 */

const LOCK_NAME = 'migrate';
/** A lock older than this belongs to a process that died mid-way; the next one takes it over. */
const LOCK_LIFETIME_MS = 10 * 60 * 1000;
const LOCK_WAIT_MS = 120 * 1000;
const LOCK_POLL_MS = 50;

/**
 * Where each QueryInterface method takes its options: the runner's transaction goes there, so a
 * migration's `qi.createTable(…)` joins it without naming it.
 */
const OPTIONS_AT: Record<string, number> = {
	createTable: 2,
	dropTable: 1,
	renameTable: 2,
	addColumn: 3,
	removeColumn: 2,
	changeColumn: 3,
	renameColumn: 3,
	addIndex: 2,
	removeIndex: 2,
	addConstraint: 1,
	removeConstraint: 2,
	describeTable: 1,
	showAllTables: 0,
	bulkInsert: 2,
	bulkUpdate: 3,
	bulkDelete: 2
};

/** A QueryInterface whose calls (and `sequelize.query`) run inside `transaction`. */
function joined(qi: QueryInterface, transaction: Transaction): QueryInterface {
	const sequelize = new Proxy(qi.sequelize, {
		get(target, key, receiver) {
			if (key === 'query') {
				return (sql: string, options: object = {}) =>
					target.query(sql, { ...options, transaction } as never);
			}
			return Reflect.get(target, key, receiver);
		}
	});
	return new Proxy(qi, {
		get(target, key, receiver) {
			if (key === 'sequelize') return sequelize;
			const value = Reflect.get(target, key, receiver);
			if (typeof key !== 'string' || typeof value !== 'function') return value;
			const at = OPTIONS_AT[key];
			if (at === undefined) {
				return () => {
					throw new Error(
						`queryInterface.${key} is not set up to join the migration's transaction; add it to OPTIONS_AT in migrate.ts.`
					);
				};
			}
			return (...args: unknown[]) => {
				// addIndex(table, options) is also allowed: then the options are the second argument.
				const index = key === 'addIndex' && !Array.isArray(args[1]) ? 1 : at;
				const options = (args[index] as object | undefined) ?? {};
				args[index] = { ...options, transaction };
				return (value as (...a: unknown[]) => unknown).apply(target, args);
			};
		}
	}) as QueryInterface;
}

async function ensureBookkeeping(sequelize: Sequelize): Promise<void> {
	for (const sql of [
		'CREATE TABLE IF NOT EXISTS schema_migrations (name VARCHAR(255) NOT NULL PRIMARY KEY)',
		'CREATE TABLE IF NOT EXISTS schema_lock (name VARCHAR(32) NOT NULL PRIMARY KEY, holder VARCHAR(64) NOT NULL, expires_at BIGINT NOT NULL)'
	]) {
		try {
			await sequelize.query(sql);
		} catch (error) {
			// PostgreSQL: two processes creating the same table at once; one of them wins.
			if (!(error instanceof UniqueConstraintError)) throw error;
		}
	}
}

/** Wait for the migration lock; returns the function that releases it. */
async function takeLock(
	sequelize: Sequelize,
	now: () => number = Date.now
): Promise<() => Promise<void>> {
	const holder = randomUUID();
	const giveUpAt = now() + LOCK_WAIT_MS;
	for (;;) {
		await sequelize.query('DELETE FROM schema_lock WHERE name = :name AND expires_at < :now', {
			replacements: { name: LOCK_NAME, now: now() }
		});
		try {
			await sequelize.query(
				'INSERT INTO schema_lock (name, holder, expires_at) VALUES (:name, :holder, :expires)',
				{ replacements: { name: LOCK_NAME, holder, expires: now() + LOCK_LIFETIME_MS } }
			);
			return async () => {
				await sequelize.query('DELETE FROM schema_lock WHERE name = :name AND holder = :holder', {
					replacements: { name: LOCK_NAME, holder }
				});
			};
		} catch (error) {
			if (!(error instanceof UniqueConstraintError)) throw error;
		}
		if (now() > giveUpAt) {
			throw new Error(
				`Another process has held the migration lock for over ${LOCK_WAIT_MS / 1000} s; if none is running, delete the row in schema_lock.`
			);
		}
		await new Promise((resolve) => setTimeout(resolve, LOCK_POLL_MS));
	}
}

/** Applied migrations, read from and written to `schema_migrations`. */
function storage(sequelize: Sequelize): UmzugStorage<QueryInterface> {
	return {
		async executed() {
			const rows = await sequelize.query<{ name: string }>(
				'SELECT name FROM schema_migrations ORDER BY name',
				{ type: QueryTypes.SELECT }
			);
			return rows.map((row) => row.name);
		},
		// Written by the migration's own transaction (see `createMigrator`), or right after it.
		async logMigration() {},
		async unlogMigration({ name }) {
			await sequelize.query('DELETE FROM schema_migrations WHERE name = :name', {
				replacements: { name }
			});
		}
	};
}

/** The umzug runner over our explicit migration list. */
export function createMigrator(sequelize: Sequelize): Umzug<QueryInterface> {
	const qi = sequelize.getQueryInterface();
	const record = (name: string, transaction?: Transaction) =>
		sequelize.query('INSERT INTO schema_migrations (name) VALUES (:name)', {
			replacements: { name },
			transaction
		});
	return new Umzug<QueryInterface>({
		migrations: migrations.map((m) => ({
			name: m.name,
			async up() {
				if (m.ownTransaction) {
					await m.up({ context: qi });
					await record(m.name);
					return;
				}
				await sequelize.transaction(async (transaction) => {
					await m.up({ context: joined(qi, transaction) });
					await record(m.name, transaction);
				});
			},
			async down() {
				if (m.ownTransaction) return m.down({ context: qi });
				await sequelize.transaction((transaction) => m.down({ context: joined(qi, transaction) }));
			}
		})),
		context: qi,
		storage: storage(sequelize),
		logger: undefined
	});
}

/**
 * Apply every pending migration, holding the migration lock; running it again (or in a second
 * process at the same time) applies nothing. Returns the names applied.
 *
 * @example await migrate() // → ['0001-accounts', …] on a fresh database, [] afterwards
 */
export async function migrate(sequelize: Sequelize = getDb()): Promise<string[]> {
	await ensureBookkeeping(sequelize);
	const release = await takeLock(sequelize);
	try {
		const applied = await createMigrator(sequelize).up();
		return applied.map((m) => m.name);
	} finally {
		await release();
	}
}

/** Bookkeeping set up without running anything: for tests that migrate step by step. */
export async function prepareMigrations(sequelize: Sequelize): Promise<void> {
	await ensureBookkeeping(sequelize);
}
