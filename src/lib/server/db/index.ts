import { AsyncLocalStorage } from 'node:async_hooks';
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

	all(sql: string, ...rest: unknown[]): this {
		const table = typeof sql === 'string' ? TABLE_INFO.exec(sql)?.[1] : undefined;
		const callback = rest.at(-1);
		if (table !== undefined && rest.length === 1 && typeof callback === 'function') {
			const done = callback as DriverCallback;
			const known = tableInfo.get(table);
			if (known) {
				process.nextTick(() => done.call(this, null, known));
				return this;
			}
			return super.all(sql, (err: Error | null, rows: unknown[]) => {
				if (!err) tableInfo.set(table, rows);
				done.call(this, err, rows);
			});
		}
		return super.all(sql, ...forgetOnDdl(sql, rest));
	}

	run(sql: string, ...rest: unknown[]): this {
		return super.run(sql, ...forgetOnDdl(sql, rest));
	}

	exec(sql: string, callback?: (err: Error | null) => void): this {
		const [after] = forgetOnDdl(sql, [callback ?? (() => {})]);
		return super.exec(sql, after as (err: Error | null) => void);
	}
}

/**
 * For a statement that changes the schema: the kept column types are dropped before it runs and
 * again when it has run (a look-up in between could have read the old schema).
 */
function forgetOnDdl(sql: unknown, rest: unknown[]): unknown[] {
	if (typeof sql !== 'string' || !DDL.test(sql)) return rest;
	tableInfo.clear();
	const callback = rest.at(-1);
	if (typeof callback !== 'function') return rest;
	return [
		...rest.slice(0, -1),
		function (this: unknown, ...args: unknown[]) {
			tableInfo.clear();
			return (callback as (...a: unknown[]) => unknown).apply(this, args);
		}
	];
}

/**
 * `PRAGMA table_info` answers, by table, shared by every connection of this process. Sequelize's
 * SQLite dialect asks for the column types of every table a model query reads before running
 * it (to turn DATETIME text into dates), one extra round trip per table per query, and opens a
 * new connection per transaction; the schema changes only through DDL, so the answers are kept
 * until a statement of this process creates, alters or drops something. (Another process changing
 * the schema of a running server's file is not supported: the server migrates at its own start.)
 */
const tableInfo = new Map<string, unknown[]>();
const TABLE_INFO = /^PRAGMA table_info\(`([^`]+)`\)$/;
const DDL = /\b(CREATE|ALTER|DROP)\s+(TABLE|INDEX|UNIQUE|VIEW|TRIGGER)\b/i;

type DriverCallback = (this: unknown, err: Error | null, rows?: unknown[]) => void;

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

/**
 * Run SQLite transactions one at a time within the process. SQLite admits one writer anyway,
 * but node-sqlite3 waits for a lock on a libuv worker thread: with four transactions waiting
 * (the default pool size) the holder's next statement finds no thread and everything stalls
 * until the busy timeouts expire. Queueing in JavaScript keeps at most one transaction at the
 * database, so nobody blocks a thread for long. Only managed transactions (with a callback) are
 * accepted: the queue must know when one ends. Correctness never rests on this queue (other
 * processes and PostgreSQL do not have it): constraints and compare-and-set updates do that.
 *
 * With `strict`, a query sent while this async context is inside a transaction but without its
 * `{ transaction }` throws at once: on SQLite it would go to another connection and wait for
 * the very lock its own transaction holds. Tests turn it on (`openDb(url, { strict: true })`).
 */
function serializeTransactions(sequelize: Sequelize, strict: boolean): void {
	const original = sequelize.transaction.bind(sequelize) as (
		...args: unknown[]
	) => Promise<unknown>;
	const inside = new AsyncLocalStorage<true>();
	let tail: Promise<void> = Promise.resolve();

	function acquire(): Promise<() => void> {
		let release!: () => void;
		const done = new Promise<void>((resolve) => (release = resolve));
		const ready = tail.then(() => release);
		tail = tail.then(() => done);
		return ready;
	}

	const queued = async (...args: unknown[]): Promise<unknown> => {
		const callback = args.find((arg) => typeof arg === 'function') as
			((t: Transaction) => Promise<unknown>) | undefined;
		const options = args.find((arg) => arg && typeof arg === 'object');
		if (!callback) {
			throw new Error(
				'Pass a callback to sequelize.transaction(async (transaction) => …); unmanaged transactions are not supported.'
			);
		}
		if (inside.getStore()) {
			// The inner one would wait for the outer one, which waits for the inner one.
			throw new Error(
				'A transaction was started inside another one; pass the outer `transaction` instead.'
			);
		}
		const release = await acquire();
		try {
			return await inside.run(true, () => original(options ?? {}, callback));
		} finally {
			release();
		}
	};
	sequelize.transaction = queued as Sequelize['transaction'];

	if (strict) {
		const query = sequelize.query.bind(sequelize) as (...args: unknown[]) => Promise<unknown>;
		sequelize.query = ((sql: unknown, options?: { transaction?: unknown }) => {
			if (inside.getStore() && !options?.transaction) {
				const text = typeof sql === 'string' ? sql : String((sql as { query?: string })?.query);
				throw new Error(
					`A query inside a transaction was sent without { transaction }: ${text.slice(0, 120)}`
				);
			}
			return query(sql, options);
		}) as Sequelize['query'];
	}
}

/** Where the dialect keeps the one connection every transaction of this process uses. */
const WRITER = 'transactions';

interface SqliteConnection {
	close(callback?: (err: Error | null) => void): void;
}

interface SqliteConnectionManager {
	connections: Record<string, SqliteConnection>;
	getConnection(options?: { uuid?: string }): Promise<SqliteConnection>;
	releaseConnection(connection: SqliteConnection, force?: boolean): void;
	destroyConnection(connection: SqliteConnection): Promise<void>;
}

/**
 * One connection for all of this process's transactions, kept open between them. The SQLite
 * dialect opens a new connection for every transaction and closes it after (a file open and our
 * pragmas each time, inside the one-at-a-time section above, so every write waited for them);
 * transactions already run one at a time here, so one connection serves them all. A transaction
 * that leaves it in doubt (a failed commit or rollback: Sequelize then destroys the connection)
 * closes it, and the next transaction opens a fresh one.
 */
function shareTransactionConnection(sequelize: Sequelize): void {
	const manager = sequelize.connectionManager as unknown as SqliteConnectionManager;
	const get = manager.getConnection.bind(manager);
	const release = manager.releaseConnection.bind(manager);
	const destroy = manager.destroyConnection.bind(manager);
	const isWriter = (c: SqliteConnection) => manager.connections[WRITER] === c;
	manager.getConnection = (options = {}) =>
		options.uuid && options.uuid !== 'default' ? get({ ...options, uuid: WRITER }) : get(options);
	manager.releaseConnection = (connection, force) => {
		if (isWriter(connection) && !force) return;
		release(connection, force);
	};
	manager.destroyConnection = async (connection) => {
		if (!isWriter(connection)) return destroy(connection);
		delete manager.connections[WRITER];
		await new Promise<void>((resolve) => connection.close(() => resolve()));
	};
}

let current: Sequelize | null = null;

/**
 * Open a database from a URL and bind the models to it, once; it becomes the one `getDb()`
 * returns. The server opens it at start (`init`: the migrations ask for it first); scripts and
 * tests call it with their own URL.
 *
 * @example openDb('sqlite:/tmp/test-1.sqlite')
 */
export function openDb(url: string, options: { strict?: boolean } = {}): Sequelize {
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
		serializeTransactions(sequelize, options.strict ?? false);
		if (storage !== ':memory:') shareTransactionConnection(sequelize);
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
