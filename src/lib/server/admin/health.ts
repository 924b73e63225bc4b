import { getDb } from '../db/index';
import { getMailStatus, type MailStatus } from '../mail/index';
import { countMessages } from '../mail/outbox';

/** A snapshot of the running site for `/admin` and `GET /api/admin/health`. */
export interface Health {
	/** True when every part that can fail (today: the database) answered. */
	ok: boolean;
	database: { ok: true; dialect: string } | { ok: false; dialect: string; error: string };
	mail: MailStatus;
	/** Messages in `DATA_DIR/outbox` (only the local stand-in fills it); null when unreadable. */
	outboxCount: number | null;
	/** Why the outbox could not be read, when it could not. */
	outboxError?: string;
	/** Seconds since this server process started. */
	uptimeSeconds: number;
	/** ISO 8601 time of the check. */
	checkedAt: string;
}

async function checkDatabase(): Promise<Health['database']> {
	let dialect = 'unknown';
	try {
		const db = getDb();
		dialect = db.getDialect();
		await db.authenticate();
		return { ok: true, dialect };
	} catch (error) {
		return { ok: false, dialect, error: error instanceof Error ? error.message : String(error) };
	}
}

/** The outbox count; a folder that cannot be read is reported, not thrown (health must answer). */
async function checkOutbox(): Promise<Pick<Health, 'outboxCount' | 'outboxError'>> {
	try {
		return { outboxCount: await countMessages() };
	} catch (error) {
		return {
			outboxCount: null,
			outboxError: error instanceof Error ? error.message : String(error)
		};
	}
}

/**
 * Ask each part of the site whether it works.
 * @example await checkHealth() // { ok: true, database: { ok: true, dialect: 'sqlite' }, mail: { mode: 'local', … }, … }
 */
export async function checkHealth(now = new Date()): Promise<Health> {
	const [database, outbox] = await Promise.all([checkDatabase(), checkOutbox()]);
	return {
		ok: database.ok,
		database,
		mail: getMailStatus(),
		...outbox,
		uptimeSeconds: Math.round(process.uptime()),
		checkedAt: now.toISOString()
	};
}
