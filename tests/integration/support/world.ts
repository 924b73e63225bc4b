import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type { Sequelize } from 'sequelize';
import { resetConfig } from '../../../src/lib/server/config';
import { closeDb, openDb } from '../../../src/lib/server/db/index';
import { migrate } from '../../../src/lib/server/db/migrate';
import { stopMail } from '../../../src/lib/server/mail/index';
import { listMessages, readMessage } from '../../../src/lib/server/mail/outbox';

/**
 * A fresh world per test file: a temporary DATA_DIR holding a migrated SQLite file and the
 * outbox of the real local SMTP stand-in (SMTP_URL unset), which `sendMail` starts on demand.
 */
export interface TestWorld {
	dataDir: string;
	db: Sequelize;
	close(): Promise<void>;
}

export async function openTestWorld(options: { migrate?: boolean } = {}): Promise<TestWorld> {
	const dataDir = await mkdtemp(path.join(os.tmpdir(), 'twelvefold-auth-'));
	process.env.DATA_DIR = dataDir;
	process.env.PUBLIC_BASE_URL = 'http://twelvefold.test';
	delete process.env.DATABASE_URL;
	delete process.env.SMTP_URL;
	resetConfig();
	// Strict: a query that forgets `{ transaction }` inside one fails the test at once.
	const db = openDb(`sqlite:${path.join(dataDir, 'test.sqlite')}`, { strict: true });
	if (options.migrate !== false) await migrate(db);
	return {
		dataDir,
		db,
		async close() {
			await stopMail();
			await closeDb();
			await rm(dataDir, { recursive: true, force: true });
		}
	};
}

/** The token in the newest mail to `to` whose link goes to `pathname`. */
export async function tokenFromOutbox(to: string, pathname: string): Promise<string> {
	for (const summary of await listMessages()) {
		if (!summary.to.includes(to)) continue;
		const read = await readMessage(summary.id);
		if (!read.ok) continue;
		for (const link of read.message.links) {
			const url = new URL(link);
			if (url.pathname === pathname && url.searchParams.get('token')) {
				return url.searchParams.get('token')!;
			}
		}
	}
	throw new Error(`No mail to ${to} links to ${pathname}`);
}
