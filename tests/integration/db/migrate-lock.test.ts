import { execFile } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { QueryTypes } from 'sequelize';
import { closeDb, openDb } from '../../../src/lib/server/db/index';
import { migrations } from '../../../src/lib/server/db/migrations/index';

const run = promisify(execFile);
let dir: string;
beforeAll(async () => {
	dir = await mkdtemp(path.join(os.tmpdir(), 'twelvefold-migrate-'));
});
afterAll(async () => {
	await closeDb();
	await rm(dir, { recursive: true, force: true });
});

/** `npm run migrate` in a child process of its own against `url`. */
function migrateInChild(url: string) {
	return run(process.execPath, ['--import', 'tsx', 'scripts/migrate.ts'], {
		env: { ...process.env, DATABASE_URL: url, DATA_DIR: dir },
		timeout: 60_000
	});
}

describe('two processes starting together', () => {
	test(
		'migrate one SQLite file once: one applies every migration, the other finds nothing to do',
		{ timeout: 180_000 },
		async () => {
			const url = `sqlite:${path.join(dir, 'shared.sqlite')}`;
			const outputs = (await Promise.all([migrateInChild(url), migrateInChild(url)])).map((r) =>
				r.stdout.trim()
			);
			const all = `Applied ${migrations.map((m) => m.name).join(', ')}`;
			expect(outputs.sort()).toEqual([all, 'Database is up to date.'].sort());

			const db = openDb(url);
			const rows = await db.query<{ name: string }>('SELECT name FROM schema_migrations', {
				type: QueryTypes.SELECT
			});
			expect(rows.map((row) => row.name).sort()).toEqual(migrations.map((m) => m.name).sort());
			// The lock was given back.
			expect(await db.query('SELECT * FROM schema_lock', { type: QueryTypes.SELECT })).toEqual([]);
		}
	);
});
