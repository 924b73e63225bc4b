import fs from 'node:fs';
import path from 'node:path';
import sqlite3 from 'sqlite3';
import { Sequelize, Transaction } from 'sequelize';
import { getConfig } from '../config';
import { initModels } from './models/index';

/**
 * The Sequelize instance. SQLite is the embedded default; any other URL (postgres://…) is handed
 * to Sequelize as is, so the models run unchanged on PostgreSQL once its driver is installed.
 *
 * Relative imports (not `$lib`) so that tsx scripts (migrate, seed, admin) load this module too.
 */

/** How long a connection waits for another writer before SQLITE_BUSY. */
const BUSY_TIMEOUT_MS = 5000;

type OpenCallback = (err: Error | null) => void;

/**
 * sqlite3 with our pragmas on every connection. Sequelize's SQLite dialect opens a fresh
 * connection per transaction and skips connect hooks, so a PRAGMA sent once would reach only the
 * default connection; setting them in the driver's own open callback reaches all of them.
 */
class TunedDatabase extends sqlite3.Database {
	constructor(filename: string, mode?: number | OpenCallback, callback?: OpenCallback) {
		const done: OpenCallback = typeof mode === 'function' ? mode : (callback ?? (() => {}));
		const openMode = typeof mode === 'number' ? mode : sqlite3.OPEN_READWRITE | sqlite3.OPEN_CREATE;
		super(filename, openMode, (err) => {
			if (err) return done(err);
			this.configure('busyTimeout', BUSY_TIMEOUT_MS);
			this.exec(
				'PRAGMA journal_mode=WAL; PRAGMA synchronous=NORMAL; PRAGMA foreign_keys=ON;',
				(pragmaErr) => done(pragmaErr ?? null)
			);
		});
	}
}

/** The driver module Sequelize loads: sqlite3 with `Database` replaced by the tuned one. */
const tunedSqlite3 = { ...sqlite3, Database: TunedDatabase };

/** Where a `sqlite:` URL points: a file path or `:memory:`. */
export function sqliteStorageOf(url: string): string | null {
	const match = /^sqlite:(?:\/\/)?(.*)$/.exec(url);
	if (!match) return null;
	const rest = match[1];
	if (rest === '' || rest === ':memory:') return ':memory:';
	return path.resolve(rest);
}

let current: Sequelize | null = null;

/**
 * Open a database from a URL and bind the models to it; it becomes the one `getDb()` returns.
 * Tests call it with a temporary file.
 *
 * @example openDb('sqlite:/tmp/test-1.sqlite')
 */
export function openDb(url: string): Sequelize {
	const storage = sqliteStorageOf(url);
	let sequelize: Sequelize;
	if (storage) {
		if (storage !== ':memory:') fs.mkdirSync(path.dirname(storage), { recursive: true });
		sequelize = new Sequelize({
			dialect: 'sqlite',
			storage,
			dialectModule: tunedSqlite3,
			// Take the write lock at BEGIN: a deferred transaction that later upgrades to a writer
			// fails with SQLITE_BUSY at once instead of waiting for the busy timeout.
			transactionType: Transaction.TYPES.IMMEDIATE,
			logging: false
		});
	} else if (/^postgres(ql)?:\/\//.test(url)) {
		sequelize = new Sequelize(url, { dialect: 'postgres', logging: false });
	} else {
		throw new Error(
			`DATABASE_URL "${url}" is neither sqlite:<path> nor postgres://…; set it to one of these.`
		);
	}
	initModels(sequelize);
	current = sequelize;
	return sequelize;
}

/** The app's database, opened on first use from `DATABASE_URL` (default: a file in DATA_DIR). */
export function getDb(): Sequelize {
	return current ?? openDb(getConfig().databaseUrl);
}

/** Close the current database (end of a script or a test file). */
export async function closeDb(): Promise<void> {
	const db = current;
	current = null;
	if (db) await db.close();
}
