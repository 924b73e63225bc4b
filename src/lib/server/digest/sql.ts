import { QueryTypes, type Transaction } from 'sequelize';
import { getDb } from '../db/index';

/**
 * Raw SQL for the mail queries, which read across many tables at once. Written once for both
 * dialects: `:name` replacements, no dialect-only functions, dates passed as Date objects (so
 * Sequelize writes them in the stored format) and read back through `toDate`.
 */

type Replacements = Record<string, unknown>;

/**
 * Rows of a SELECT (or of an INSERT/UPDATE … RETURNING).
 * @example await selectRows<{ n: number }>('SELECT COUNT(*) AS n FROM users', {})
 */
export async function selectRows<T extends object>(
	sql: string,
	replacements: Replacements,
	transaction?: Transaction
): Promise<T[]> {
	return getDb().query<T>(sql, { replacements, type: QueryTypes.SELECT, transaction });
}

/**
 * Run a write (INSERT, UPDATE) and answer how many rows it changed; an insert-or-ignore that met
 * an existing row changed none.
 * @example await changeRows('UPDATE users SET name = :n WHERE id = :id', { n: 'Ada', id }) // 1
 */
export async function changeRows(
	sql: string,
	replacements: Replacements,
	transaction?: Transaction
): Promise<number> {
	// BULKUPDATE is the query type whose answer is the changed-row count on both dialects.
	const changed = await getDb().query(sql, {
		replacements,
		type: QueryTypes.BULKUPDATE,
		transaction
	});
	return Number(changed) || 0;
}

/**
 * A single write in a transaction of its own. On SQLite a write outside any transaction waits
 * for the lock on one of node-sqlite3's few worker threads, where it can starve the transaction
 * holding the lock; a transaction waits in the process's queue instead (see db/index.ts).
 * @example await writeAlone('UPDATE mail_sends SET status = :s WHERE id = :id', { s: 'sent', id })
 */
export async function writeAlone(sql: string, replacements: Replacements): Promise<number> {
	return getDb().transaction((transaction) => changeRows(sql, replacements, transaction));
}

/** A date column as read raw: a Date on PostgreSQL, '2026-03-01 04:00:00.000 +00:00' on SQLite. */
export function toDate(value: unknown): Date | null {
	if (value === null || value === undefined) return null;
	if (value instanceof Date) return value;
	const text = String(value);
	// SQLite's stored form: a space before the time and before the offset.
	const iso = text.replace(' ', 'T').replace(/ ([+-]\d{2}:\d{2})$/, '$1');
	const date = new Date(iso);
	return Number.isNaN(date.getTime()) ? null : date;
}

/** A count or sum as read raw: PostgreSQL hands back bigints as strings. */
export function toNumber(value: unknown): number {
	const n = Number(value ?? 0);
	return Number.isFinite(n) ? n : 0;
}
