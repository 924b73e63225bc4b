import path from 'node:path';

/**
 * Runtime configuration, read once from the environment. `process.env` rather than `$env` so
 * that the same module serves the SvelteKit server, vitest and the tsx scripts (seed, migrate,
 * admin). Every variable is documented in `.env.example` and the README.
 */
export interface Config {
	/** Folder for the SQLite file, the mail outbox and uploads. */
	dataDir: string;
	/** `sqlite:` path or `postgres://…`; defaults to a SQLite file in `dataDir`. */
	databaseUrl: string;
	/** SMTP service URL; when empty the app runs its own local SMTP stand-in. */
	smtpUrl: string | null;
	/** Sender of every mail. */
	mailFrom: string;
	/** Public base URL used in links inside mails (falls back to ORIGIN). */
	baseUrl: string;
	production: boolean;
	/** `AUTH_LIMIT_SCALE`: multiplies every sign-in/sign-up/reset limit (default 1). */
	authLimitScale: number;
	/** The session cookie's `Secure` flag: on in production, where the site is served over https. */
	secureCookies: boolean;
	/**
	 * When the scheduled mails (Daily reminder, Weekly class summary) are looked for: a cron
	 * pattern (croner syntax, seconds optional), or null when `DIGEST_SCHEDULE=off`.
	 */
	digestSchedule: string | null;
}

function readConfig(env: NodeJS.ProcessEnv = process.env): Config {
	const dataDir = path.resolve(env.DATA_DIR || './data');
	const port = env.PORT || '3000';
	const scale = Number(env.AUTH_LIMIT_SCALE ?? 1);
	return {
		dataDir,
		databaseUrl: env.DATABASE_URL || `sqlite:${path.join(dataDir, 'twelvefold.sqlite')}`,
		smtpUrl: env.SMTP_URL || null,
		mailFrom: env.MAIL_FROM || 'Twelvefold <no-reply@twelvefold.test>',
		baseUrl: (env.PUBLIC_BASE_URL || env.ORIGIN || `http://localhost:${port}`).replace(/\/$/, ''),
		production: env.NODE_ENV === 'production',
		authLimitScale: Number.isFinite(scale) && scale > 0 ? scale : 1,
		secureCookies: env.NODE_ENV === 'production',
		digestSchedule: env.DIGEST_SCHEDULE === 'off' ? null : env.DIGEST_SCHEDULE || '*/5 * * * *'
	};
}

let current: Config | null = null;

/** The configuration in force; read lazily so tests can set `process.env` first. */
export function getConfig(): Config {
	current ??= readConfig();
	return current;
}

/** Forget the cached configuration (tests that change `process.env` between cases). */
export function resetConfig(): void {
	current = null;
}
