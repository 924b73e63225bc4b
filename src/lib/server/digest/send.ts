import { randomBytes, randomUUID } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { getConfig } from '../config';
import { getDb } from '../db/index';
import { openBulkMailer, type BulkMailer, type MailInput } from '../mail/index';
import { digestMail, summaryMail } from '../mail/templates/digest';
import type { MailContent } from '../mail/templates/layout';
import { addDays, practiceDay, wallClock } from '../../practice/day';
import { isoWeekday } from '../../practice/digest';
import {
	gatherLearnerDigest,
	worthSending,
	type LearnerDigest,
	type MailRecipient
} from './learner';
import { changeRows, selectRows, toNumber, writeAlone } from './sql';
import { gatherTeacherSummary, summaryWorthSending, type TeacherSummary } from './teacher';
import {
	ensureMailSecret,
	unsubscribeLinks,
	unsubscribeToken,
	type MailChoice
} from './unsubscribe';

/**
 * Sending the scheduled mails. A run finds, with one query per kind of mail, the people whose
 * local hour has come on their current practice day and who have no `mail_sends` row for that
 * day yet; for each it inserts the row (insert-or-ignore on the unique person, kind and day) and
 * gathers what the mail would say in the same transaction, so that whichever process inserts the
 * row is the one that sends, and a person with nothing to read gets a `skipped` row instead. The
 * mail itself goes out after the commit, through a pooled transport; a failure is written on the
 * row with the time of the next try.
 */

/** How long a claim may stay unsettled before another run takes it over (its sender died). */
const CLAIM_LEASE_MS = 30 * 60 * 1000;
/** Minutes to wait before each retry after a failed send; after the last one it is given up. */
export const RETRY_DELAYS_MINUTES = [2, 8, 32, 128] as const;
/** People looked at per query; a run repeats the query until no one is left. */
const BATCH = 500;

export interface RunOptions {
	/** The instant to act at (`--now`); the current time when left out. */
	now?: Date;
	/** Compose and return the mails instead of claiming and sending them. */
	dryRun?: boolean;
	/** Which mails to look at; both when left out. */
	kinds?: readonly MailChoice[];
	/** A sender to use (tests, the benchmark); a pooled one is opened and closed otherwise. */
	mailer?: BulkMailer;
	/** Mails composed and handed over at once. */
	concurrency?: number;
	log?: (line: string) => void;
}

export interface MailPreview {
	kind: MailChoice;
	to: string;
	day: string;
	subject: string;
	text: string;
}

export interface RunReport {
	sent: number;
	/** Claimed, but nothing to say: nothing due and nothing new (or no learners in any class). */
	skipped: number;
	failed: number;
	/** Found, but another process had claimed them first. */
	taken: number;
	/** Earlier failures (or abandoned claims) tried again in this run. */
	retried: number;
	/** Dry runs only: the mails that would have gone out. */
	previews: MailPreview[];
}

interface Candidate extends MailRecipient {
	day: string;
}

/** The local hour, date and weekday of every zone in use, at `now`. */
interface ZoneNow {
	timezone: string;
	hour: number;
	date: string;
	previous: string;
}

function zonesAt(zones: string[], now: Date, log: (line: string) => void): ZoneNow[] {
	const out: ZoneNow[] = [];
	for (const timezone of zones) {
		try {
			const w = wallClock(now, timezone);
			const pad = (n: number) => String(n).padStart(2, '0');
			const date = `${w.year}-${pad(w.month)}-${pad(w.day)}`;
			out.push({ timezone, hour: w.hour, date, previous: addDays(date, -1) });
		} catch {
			log(`[digest] skipping people in the unknown time zone ${JSON.stringify(timezone)}`);
		}
	}
	return out;
}

/** `VALUES (…), (…)` of the zones with typed placeholders (PostgreSQL types them as text otherwise). */
function zoneValues(zones: ZoneNow[]): { sql: string; replacements: Record<string, unknown> } {
	const replacements: Record<string, unknown> = {};
	const rows = zones.map((z, i) => {
		replacements[`z${i}`] = z.timezone;
		replacements[`h${i}`] = z.hour;
		replacements[`d${i}`] = z.date;
		replacements[`p${i}`] = z.previous;
		replacements[`w${i}`] = isoWeekday(z.date);
		replacements[`pw${i}`] = isoWeekday(z.previous);
		return (
			`(CAST(:z${i} AS VARCHAR(64)), CAST(:h${i} AS INTEGER), CAST(:d${i} AS VARCHAR(10)), ` +
			`CAST(:p${i} AS VARCHAR(10)), CAST(:w${i} AS INTEGER), CAST(:pw${i} AS INTEGER))`
		);
	});
	return { sql: rows.join(', '), replacements };
}

// The practice day in each zone: before the person's day-start hour it is still yesterday's.
const PRACTICE_DAY =
	'CASE WHEN z.local_hour >= u.day_start_hour THEN z.local_date ELSE z.previous_date END';
const PRACTICE_WEEKDAY =
	'CASE WHEN z.local_hour >= u.day_start_hour THEN z.weekday ELSE z.previous_weekday END';

/**
 * The people whose `kind` of mail is due at `now` and not yet claimed for their practice day:
 * one query over the users joined to the zones in use (index `users_zone_digest` /
 * `users_summary_due`), the `mail_sends` unique index answering "not yet" for each.
 */
async function findCandidates(
	kind: MailChoice,
	zones: ZoneNow[],
	page: { limit: number; offset: number }
): Promise<Candidate[]> {
	if (zones.length === 0) return [];
	const values = zoneValues(zones);
	const choice =
		kind === 'digest'
			? 'u.digest_enabled = TRUE'
			: `u.summary_enabled = TRUE AND u.summary_weekday = ${PRACTICE_WEEKDAY}
			   AND EXISTS (SELECT 1 FROM classes c WHERE c.teacher_id = u.id AND c.archived_at IS NULL)`;
	const rows = await selectRows<{
		id: string;
		name: string;
		email: string;
		timezone: string;
		digest_hour: unknown;
		day_start_hour: unknown;
		settings: unknown;
		day: string;
	}>(
		`WITH zones (timezone, local_hour, local_date, previous_date, weekday, previous_weekday)
		   AS (VALUES ${values.sql})
		 SELECT u.id, u.name, u.email, u.timezone, u.digest_hour, u.day_start_hour, u.settings,
		   ${PRACTICE_DAY} AS day
		 FROM zones z JOIN users u ON u.timezone = z.timezone
		 WHERE ${choice}
		   AND u.email_verified_at IS NOT NULL
		   AND (z.local_hour - u.day_start_hour + 24) % 24 >= (u.digest_hour - u.day_start_hour + 24) % 24
		   AND NOT EXISTS (SELECT 1 FROM mail_sends m
		     WHERE m.user_id = u.id AND m.kind = :kind AND m.day = ${PRACTICE_DAY})
		 ORDER BY u.id LIMIT :limit OFFSET :offset`,
		{ ...values.replacements, kind, limit: page.limit, offset: page.offset }
	);
	return rows.map((r) => ({
		id: r.id,
		name: r.name,
		email: r.email,
		timezone: r.timezone,
		digestHour: toNumber(r.digest_hour),
		dayStartHour: toNumber(r.day_start_hour),
		settings: r.settings,
		day: r.day
	}));
}

type Gathered =
	{ kind: 'digest'; content: LearnerDigest } | { kind: 'summary'; content: TeacherSummary };

async function gather(
	kind: MailChoice,
	who: Candidate,
	now: Date,
	transaction?: Transaction
): Promise<Gathered | null> {
	if (kind === 'digest') {
		const content = await gatherLearnerDigest(who, who.day, now, transaction);
		return worthSending(content) ? { kind, content } : null;
	}
	const content = await gatherTeacherSummary(who, who.day, transaction);
	return summaryWorthSending(content) ? { kind, content } : null;
}

async function render(who: Candidate, gathered: Gathered, secret?: string): Promise<MailInput> {
	const { baseUrl } = getConfig();
	secret ??= await ensureMailSecret(who.id);
	const unsubscribe = unsubscribeLinks(unsubscribeToken(who.id, gathered.kind, secret));
	const links = {
		action: gathered.kind === 'digest' ? `${baseUrl}/drill` : `${baseUrl}/teach`,
		settings: `${baseUrl}/settings`,
		unsubscribePage: unsubscribe.page,
		unsubscribeOneClick: unsubscribe.oneClick
	};
	const when = `${String(who.digestHour).padStart(2, '0')}:00 (${who.timezone})`;
	const mail: MailContent =
		gathered.kind === 'digest'
			? digestMail({ ...gathered.content, name: who.name, when, links })
			: summaryMail({ ...gathered.content, name: who.name, when, links });
	return { to: who.email, ...mail };
}

/** The outcome of claiming one person's mail. */
type Claim =
	| { outcome: 'taken' | 'skipped' }
	| { outcome: 'claimed'; id: string; attempts: number; gathered: Gathered; secret: string };

/**
 * Claim one person's mail for their day: insert the row (insert-or-ignore on the unique person,
 * kind and day) and record the decision in it, in one transaction. Only the process whose insert
 * lands goes on to send; the other finds the row and does nothing. What the mail would say is
 * read just before (plain reads, which SQLite's WAL runs beside other writers), so that the
 * transaction, which holds SQLite's single write lock, stays a few statements long.
 */
async function claim(kind: MailChoice, who: Candidate, now: Date): Promise<Claim> {
	const gathered = await gather(kind, who, now);
	return getDb().transaction(async (transaction): Promise<Claim> => {
		const id = randomUUID();
		const inserted = await changeRows(
			`INSERT INTO mail_sends
			   (id, user_id, kind, day, status, attempts, next_attempt_at, created_at, updated_at)
			 VALUES (:id, :user, :kind, :day, :status, 1, :lease, :now, :now)
			 ON CONFLICT (user_id, kind, day) DO NOTHING`,
			{
				id,
				user: who.id,
				kind,
				day: who.day,
				status: gathered ? 'claimed' : 'skipped',
				lease: gathered ? new Date(now.getTime() + CLAIM_LEASE_MS) : null,
				now
			},
			transaction
		);
		if (inserted === 0) return { outcome: 'taken' };
		if (!gathered) return { outcome: 'skipped' };
		// The key that signs the unsubscribe link, made here on the first mail to this person.
		await changeRows(
			'UPDATE users SET mail_secret = :secret WHERE id = :id AND mail_secret IS NULL',
			{ id: who.id, secret: randomBytes(32).toString('base64url') },
			transaction
		);
		const [row] = await selectRows<{ secret: string }>(
			'SELECT mail_secret AS secret FROM users WHERE id = :id',
			{ id: who.id },
			transaction
		);
		return { outcome: 'claimed', id, attempts: 1, gathered, secret: row.secret };
	});
}

/** Send a claimed mail and settle its row: sent, or failed with the time of the next try. */
async function deliver(
	row: { id: string; attempts: number; secret?: string },
	who: Candidate,
	gathered: Gathered,
	now: Date,
	mailer: BulkMailer,
	log: (line: string) => void
): Promise<'sent' | 'failed'> {
	try {
		await mailer.send(await render(who, gathered, row.secret));
	} catch (error) {
		const message = error instanceof Error ? error.message : String(error);
		const delay = RETRY_DELAYS_MINUTES[row.attempts - 1];
		const next = delay === undefined ? null : new Date(now.getTime() + delay * 60_000);
		await writeAlone(
			`UPDATE mail_sends SET status = 'failed', last_error = :message,
			   next_attempt_at = :next, updated_at = :now WHERE id = :id`,
			{ id: row.id, message: message.slice(0, 1000), next, now }
		);
		log(
			`[digest] ${gathered.kind} to ${who.email} for ${who.day} failed (attempt ${row.attempts}): ${message}; ` +
				(next ? `next try at ${next.toISOString()}` : 'giving up')
		);
		return 'failed';
	}
	await writeAlone(
		`UPDATE mail_sends SET status = 'sent', sent_at = :now, next_attempt_at = NULL,
		   last_error = NULL, updated_at = :now WHERE id = :id`,
		{ id: row.id, now }
	);
	return 'sent';
}

/**
 * Earlier failures whose next try has come, and claims abandoned by a sender that stopped:
 * each is taken over by compare-and-set on its attempt count, so only one process retries it.
 */
async function retryDue(
	now: Date,
	mailer: BulkMailer,
	report: RunReport,
	concurrency: number,
	log: (line: string) => void
): Promise<void> {
	const rows = await selectRows<{
		row_id: string;
		kind: MailChoice;
		day: string;
		attempts: unknown;
		status: string;
		id: string;
		name: string;
		email: string;
		timezone: string;
		digest_hour: unknown;
		day_start_hour: unknown;
		settings: unknown;
		digest_enabled: unknown;
		summary_enabled: unknown;
	}>(
		`SELECT m.id AS row_id, m.kind, m.day, m.attempts, m.status, u.id, u.name, u.email,
		   u.timezone, u.digest_hour, u.day_start_hour, u.settings, u.digest_enabled, u.summary_enabled
		 FROM mail_sends m JOIN users u ON u.id = m.user_id
		 WHERE m.status IN ('failed', 'claimed') AND m.next_attempt_at IS NOT NULL
		   AND m.next_attempt_at <= :now
		 ORDER BY m.next_attempt_at LIMIT 200`,
		{ now }
	);
	await eachLimited(rows, concurrency, async (row) => {
		const who: Candidate = {
			id: row.id,
			name: row.name,
			email: row.email,
			timezone: row.timezone,
			digestHour: toNumber(row.digest_hour),
			dayStartHour: toNumber(row.day_start_hour),
			settings: row.settings,
			day: row.day
		};
		const seen = toNumber(row.attempts);
		const stillWanted = Boolean(
			toNumber(row.kind === 'digest' ? row.digest_enabled : row.summary_enabled)
		);
		const stillToday = practiceDay(now, who.timezone, who.dayStartHour) === row.day;
		// What the mail would say, read before the transaction as in `claim`.
		const gathered = stillWanted && stillToday ? await gather(row.kind, who, now) : null;
		const taken = await getDb().transaction(async (transaction) => {
			if (!stillWanted || !stillToday) {
				// Turned off since, or the day it was for is over: a late reminder would mislead.
				await changeRows(
					`UPDATE mail_sends SET status = :status, next_attempt_at = NULL, updated_at = :now,
					   last_error = COALESCE(last_error, :why)
					 WHERE id = :id AND attempts = :seen AND status = :was`,
					{
						id: row.row_id,
						seen,
						was: row.status,
						now,
						status: stillWanted ? 'failed' : 'skipped',
						why: stillWanted ? 'the practice day ended before it could be sent' : 'turned off'
					},
					transaction
				);
				return null;
			}
			// Taken over by compare-and-set on the attempt count, with the decision in the row.
			const won = await changeRows(
				`UPDATE mail_sends SET status = :status, attempts = attempts + 1,
				   next_attempt_at = :lease, updated_at = :now
				 WHERE id = :id AND attempts = :seen AND status = :was`,
				{
					id: row.row_id,
					seen,
					was: row.status,
					now,
					status: gathered ? 'claimed' : 'skipped',
					lease: gathered ? new Date(now.getTime() + CLAIM_LEASE_MS) : null
				},
				transaction
			);
			if (won === 0) return null;
			if (!gathered) {
				report.skipped++;
				return null;
			}
			return gathered;
		});
		if (!taken) return;
		report.retried++;
		const outcome = await deliver(
			{ id: row.row_id, attempts: seen + 1 },
			who,
			taken,
			now,
			mailer,
			log
		);
		report[outcome]++;
	});
}

/** Run `task` over `items`, at most `limit` at a time. */
async function eachLimited<T>(
	items: readonly T[],
	limit: number,
	task: (item: T) => Promise<void>
): Promise<void> {
	let next = 0;
	const worker = async () => {
		while (next < items.length) await task(items[next++]);
	};
	await Promise.all(Array.from({ length: Math.min(limit, items.length) }, worker));
}

/**
 * One run of the scheduled mails at `now`: retries first, then everyone whose hour has come.
 * @example await runScheduledMail({ now: new Date('2026-03-02T08:00:00Z') }) // { sent: 3, skipped: 1, … }
 */
export async function runScheduledMail(options: RunOptions = {}): Promise<RunReport> {
	const now = options.now ?? new Date();
	const kinds = options.kinds ?? (['digest', 'summary'] as const);
	const concurrency = options.concurrency ?? 4;
	const log = options.log ?? ((line: string) => console.log(line));
	const report: RunReport = { sent: 0, skipped: 0, failed: 0, taken: 0, retried: 0, previews: [] };

	const zoneRows = await selectRows<{ timezone: string }>(
		'SELECT DISTINCT timezone FROM users',
		{}
	);
	const zones = zonesAt(
		zoneRows.map((z) => z.timezone),
		now,
		log
	);

	if (options.dryRun) {
		for (const kind of kinds) {
			for (let offset = 0; ; offset += BATCH) {
				const batch = await findCandidates(kind, zones, { limit: BATCH, offset });
				for (const who of batch) {
					const gathered = await gather(kind, who, now);
					if (!gathered) {
						report.skipped++;
						continue;
					}
					const mail = await render(who, gathered);
					report.previews.push({
						kind,
						to: who.email,
						day: who.day,
						subject: mail.subject,
						text: mail.text
					});
				}
				if (batch.length < BATCH) break;
			}
		}
		return report;
	}

	const mailer = options.mailer ?? (await openBulkMailer());
	try {
		await retryDue(now, mailer, report, concurrency, log);
		for (const kind of kinds) {
			// Someone whose claim failed outright (a database error) would come back in the next
			// query; each person is looked at once per run.
			const seen = new Set<string>();
			for (;;) {
				const batch = (await findCandidates(kind, zones, { limit: BATCH, offset: 0 })).filter(
					(who) => !seen.has(who.id)
				);
				if (batch.length === 0) break;
				await eachLimited(batch, concurrency, async (who) => {
					seen.add(who.id);
					let claimed: Claim;
					try {
						claimed = await claim(kind, who, now);
					} catch (error) {
						log(
							`[digest] could not claim the ${kind} of ${who.email}: ${(error as Error).message}`
						);
						return;
					}
					if (claimed.outcome !== 'claimed') {
						report[claimed.outcome]++;
						return;
					}
					report[await deliver(claimed, who, claimed.gathered, now, mailer, log)]++;
				});
			}
		}
	} finally {
		if (!options.mailer) mailer.close();
	}
	return report;
}
