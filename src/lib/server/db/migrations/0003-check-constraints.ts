import { QueryTypes, type QueryInterface, type Transaction } from 'sequelize';
import type { Migration } from './types';

/**
 * Closed sets of values become strings with a CHECK instead of ENUMs (`users.role`,
 * `email_tokens.purpose`): a new value then needs no `ALTER TYPE` on PostgreSQL. And at most one
 * live mailed link per person and purpose, as a partial unique index (portable to both
 * dialects), so "only the newest link works" holds with several processes.
 *
 * On SQLite a column's type changes only by rebuilding its table, and dropping `users` with
 * foreign keys on would delete every row that cascades from it. So this migration runs outside
 * the runner's transaction: foreign keys off (a PRAGMA that has no effect inside a transaction),
 * the rebuild in its own transaction, `PRAGMA foreign_key_check`, foreign keys on again.
 */

const ROLE_CHECK = "role IN ('learner', 'teacher', 'admin')";
const PURPOSE_CHECK = "purpose IN ('verify', 'reset')";

/** Table name → [column, its old SQLite definition, its new one]. */
const SQLITE_COLUMNS: Record<string, [RegExp, string]> = {
	users: [
		/`role` TEXT NOT NULL DEFAULT 'learner'/,
		`\`role\` VARCHAR(16) NOT NULL DEFAULT 'learner' CHECK (${ROLE_CHECK})`
	],
	email_tokens: [
		/`purpose` TEXT NOT NULL/,
		`\`purpose\` VARCHAR(16) NOT NULL CHECK (${PURPOSE_CHECK})`
	]
};

/** Rebuild one SQLite table with a changed column definition, keeping rows and indexes. */
async function rebuildSqliteTable(qi: QueryInterface, table: string, from: RegExp, to: string) {
	const db = qi.sequelize;
	const [created] = await db.query<{ sql: string }>(
		"SELECT sql FROM sqlite_master WHERE type = 'table' AND name = :table",
		{ type: QueryTypes.SELECT, replacements: { table } }
	);
	if (!created) throw new Error(`Table ${table} does not exist.`);
	if (!from.test(created.sql)) {
		if (created.sql.includes(to)) return; // already rebuilt
		throw new Error(`Table ${table} does not have the expected column: ${created.sql}`);
	}
	const indexes = await db.query<{ sql: string }>(
		"SELECT sql FROM sqlite_master WHERE type = 'index' AND tbl_name = :table AND sql IS NOT NULL",
		{ type: QueryTypes.SELECT, replacements: { table } }
	);
	const rebuilt = `${table}_rebuilt`;
	const createSql = created.sql
		.replace(/^CREATE TABLE `?\w+`?/, `CREATE TABLE \`${rebuilt}\``)
		.replace(from, to);
	await db.query(createSql);
	await db.query(`INSERT INTO \`${rebuilt}\` SELECT * FROM \`${table}\``);
	await db.query(`DROP TABLE \`${table}\``);
	await db.query(`ALTER TABLE \`${rebuilt}\` RENAME TO \`${table}\``);
	for (const index of indexes) await db.query(index.sql);
}

/** Keep only the newest live token of each person and purpose (older ones count as used). */
async function voidOlderLiveTokens(qi: QueryInterface, transaction?: Transaction) {
	await qi.sequelize.query(
		`UPDATE email_tokens SET used_at = created_at
		 WHERE used_at IS NULL AND EXISTS (
			SELECT 1 FROM email_tokens newer
			WHERE newer.user_id = email_tokens.user_id AND newer.purpose = email_tokens.purpose
			  AND newer.used_at IS NULL
			  AND (newer.created_at > email_tokens.created_at
			       OR (newer.created_at = email_tokens.created_at AND newer.id > email_tokens.id)))`,
		{ transaction }
	);
}

const LIVE_INDEX =
	'CREATE UNIQUE INDEX IF NOT EXISTS email_tokens_live ON email_tokens (user_id, purpose) WHERE used_at IS NULL';

export const checkConstraints: Migration = {
	name: '0003-check-constraints',
	// On SQLite it manages its own transaction (see above); on PostgreSQL DDL is transactional.
	ownTransaction: true,
	async up({ context: qi }) {
		const db = qi.sequelize;
		if (db.getDialect() === 'sqlite') {
			await db.query('PRAGMA foreign_keys = OFF');
			try {
				await db.query('BEGIN IMMEDIATE');
				try {
					for (const [table, [from, to]] of Object.entries(SQLITE_COLUMNS)) {
						await rebuildSqliteTable(qi, table, from, to);
					}
					await voidOlderLiveTokens(qi);
					await db.query(LIVE_INDEX);
					const broken = await db.query('PRAGMA foreign_key_check', { type: QueryTypes.SELECT });
					if (broken.length > 0) {
						throw new Error(`Foreign keys broken by the rebuild: ${JSON.stringify(broken)}`);
					}
					await db.query('COMMIT');
				} catch (error) {
					await db.query('ROLLBACK');
					throw error;
				}
			} finally {
				await db.query('PRAGMA foreign_keys = ON');
			}
			return;
		}
		await db.transaction(async (transaction) => {
			const run = (sql: string) => db.query(sql, { transaction });
			await run('ALTER TABLE users ALTER COLUMN role DROP DEFAULT');
			await run('ALTER TABLE users ALTER COLUMN role TYPE VARCHAR(16) USING role::text');
			await run("ALTER TABLE users ALTER COLUMN role SET DEFAULT 'learner'");
			await run(`ALTER TABLE users ADD CONSTRAINT users_role_check CHECK (${ROLE_CHECK})`);
			await run('DROP TYPE IF EXISTS enum_users_role');
			await run(
				'ALTER TABLE email_tokens ALTER COLUMN purpose TYPE VARCHAR(16) USING purpose::text'
			);
			await run(
				`ALTER TABLE email_tokens ADD CONSTRAINT email_tokens_purpose_check CHECK (${PURPOSE_CHECK})`
			);
			await run('DROP TYPE IF EXISTS enum_email_tokens_purpose');
			await voidOlderLiveTokens(qi, transaction);
			await run(LIVE_INDEX);
		});
	},
	async down({ context: qi }) {
		// The CHECKed strings accept exactly what the ENUMs did; only the index is taken back.
		await qi.sequelize.query('DROP INDEX IF EXISTS email_tokens_live');
	}
};
