import { QueryTypes } from 'sequelize';
import { addDays, daysBetween, practiceDay } from '../../practice/day';
import { getDb } from '../db/index';
import { clocksOf, dayNumberSql, type LearnerClock } from './clock';
import {
	assignmentIdsOf,
	classNotFound,
	invalid,
	isoOrNull,
	num,
	ownClass,
	type Actor,
	type Result
} from './common';
import { normalizeKey } from './keys';

/**
 * The class progress table: one row a learner, computed in SQL over the review log (grouped by
 * learner and day, by learner and key, and by runs of days), never by loading reviews. Every
 * figure counts only practice of the class's assigned decks (or of one assignment when filtered),
 * so a teacher sees the work they assigned and nothing a learner does elsewhere.
 */

export interface ProgressRow {
	userId: string;
	name: string;
	/** ISO time of the latest review; null before any. */
	lastPracticeAt: string | null;
	/** Reviews on the learner's current practice day (their zone and day-start hour). */
	doneToday: number;
	/** Introduced cards due now. */
	dueNow: number;
	/** Practice days in a row up to today, or up to yesterday while today is still open. */
	streak: number;
	/** Share of recalls (any grade but the lowest) of licks already learned, last 30 days; null with none. */
	retention: number | null;
	reviewsThisWeek: number;
	minutesThisWeek: number;
	/** Up to three keys with the lowest recall over the last 60 days (only keys with a lapse). */
	weakestKeys: string[];
	/** Average of tempo reached / target tempo over the learner's introduced cards; null with none. */
	tempoReached: number | null;
	/** Introduced cards (the base of tempoReached). */
	cardsStarted: number;
}

export const PROGRESS_SORTS = [
	'name',
	'lastPracticeAt',
	'doneToday',
	'dueNow',
	'streak',
	'retention',
	'reviewsThisWeek',
	'minutesThisWeek',
	'tempoReached'
] as const;
export type ProgressSort = (typeof PROGRESS_SORTS)[number];

export interface ProgressQuery {
	assignmentId?: unknown;
	sort?: unknown;
	dir?: unknown;
}

/** Days of the retention window and of the weak-key window. */
export const RETENTION_DAYS = 30;
export const WEAK_KEY_DAYS = 60;
/** A key needs this many reviews in the window before it can be called weak. */
export const WEAK_KEY_MIN_REVIEWS = 3;

const scopeJoin = `FROM reviews r JOIN cards c ON c.id = r.card_id
	WHERE r.user_id IN (:userIds) AND c.assignment_id IN (:assignmentIds) AND r.undone_at IS NULL`;

interface Scope {
	userIds: string[];
	assignmentIds: string[];
}

/**
 * The rows for `scope` at `now`, unsorted; `clocks` gives each learner's practice day.
 * Exported for the benchmark, which runs it beside a single hand-written query.
 */
export async function computeProgress(
	scope: Scope,
	clocks: Map<string, LearnerClock>,
	now: Date
): Promise<ProgressRow[]> {
	const db = getDb();
	const today = new Map<string, string>();
	for (const id of scope.userIds) {
		const clock = clocks.get(id);
		today.set(id, practiceDay(now, clock?.timezone ?? 'UTC', clock?.dayStartHour ?? 4));
	}
	const rows = new Map<string, ProgressRow>();
	for (const id of scope.userIds) {
		rows.set(id, {
			userId: id,
			name: clocks.get(id)?.name ?? '',
			lastPracticeAt: null,
			doneToday: 0,
			dueNow: 0,
			streak: 0,
			retention: null,
			reviewsThisWeek: 0,
			minutesThisWeek: 0,
			weakestKeys: [],
			tempoReached: null,
			cardsStarted: 0
		});
	}
	if (scope.userIds.length === 0 || scope.assignmentIds.length === 0) return [...rows.values()];
	const earliestToday = [...today.values()].sort()[0];
	const replacements = { ...scope, now };
	const select = QueryTypes.SELECT;

	// 1. Per learner and day over the last 30 days: counts, time, and recalls of learned licks.
	const recent = await db.query<{
		user_id: string;
		day: string;
		reviews: unknown;
		ms: unknown;
		learned: unknown;
		recalled: unknown;
	}>(
		`SELECT r.user_id, r.day, COUNT(*) AS reviews,
		        SUM(COALESCE(r.reveal_ms, 0) + COALESCE(r.grade_ms, 0)) AS ms,
		        SUM(CASE WHEN c.introduced_day < r.day THEN 1 ELSE 0 END) AS learned,
		        SUM(CASE WHEN c.introduced_day < r.day AND r.grade > 1 THEN 1 ELSE 0 END) AS recalled
		   ${scopeJoin} AND r.day >= :since
		  GROUP BY r.user_id, r.day`,
		{
			replacements: { ...replacements, since: addDays(earliestToday, -(RETENTION_DAYS - 1)) },
			type: select
		}
	);
	const retention = new Map<string, { learned: number; recalled: number }>();
	for (const r of recent) {
		const row = rows.get(r.user_id);
		const t = today.get(r.user_id);
		if (!row || !t) continue;
		const age = daysBetween(r.day, t);
		if (age < 0 || age >= RETENTION_DAYS) continue;
		if (age === 0) row.doneToday += num(r.reviews);
		if (age < 7) {
			row.reviewsThisWeek += num(r.reviews);
			row.minutesThisWeek += num(r.ms) / 60_000;
		}
		const acc = retention.get(r.user_id) ?? { learned: 0, recalled: 0 };
		acc.learned += num(r.learned);
		acc.recalled += num(r.recalled);
		retention.set(r.user_id, acc);
	}
	for (const [id, acc] of retention) {
		const row = rows.get(id)!;
		row.retention = acc.learned > 0 ? acc.recalled / acc.learned : null;
	}
	for (const row of rows.values()) row.minutesThisWeek = Math.round(row.minutesThisWeek);

	// 2. Per learner and key over the last 60 days.
	const keys = await db.query<{
		user_id: string;
		key: string;
		reviews: unknown;
		recalled: unknown;
	}>(
		`SELECT r.user_id, r.key, COUNT(*) AS reviews,
		        SUM(CASE WHEN r.grade > 1 THEN 1 ELSE 0 END) AS recalled
		   ${scopeJoin} AND r.day >= :since
		  GROUP BY r.user_id, r.key`,
		{
			replacements: { ...replacements, since: addDays(earliestToday, -(WEAK_KEY_DAYS - 1)) },
			type: select
		}
	);
	const byKey = new Map<string, Map<string, { reviews: number; recalled: number }>>();
	for (const k of keys) {
		// The drill may spell a key either way (F# or Gb): one key, one count.
		const key = normalizeKey(k.key) ?? k.key;
		const perUser = byKey.get(k.user_id) ?? new Map();
		const acc = perUser.get(key) ?? { reviews: 0, recalled: 0 };
		acc.reviews += num(k.reviews);
		acc.recalled += num(k.recalled);
		perUser.set(key, acc);
		byKey.set(k.user_id, perUser);
	}
	for (const [id, perUser] of byKey) {
		rows.get(id)!.weakestKeys = [...perUser]
			.filter(([, a]) => a.reviews >= WEAK_KEY_MIN_REVIEWS && a.recalled < a.reviews)
			.map(([key, a]) => ({ key, recall: a.recalled / a.reviews, reviews: a.reviews }))
			.sort((a, b) => a.recall - b.recall || b.reviews - a.reviews || a.key.localeCompare(b.key))
			.slice(0, 3)
			.map((k) => k.key);
	}

	// 3. Runs of consecutive practice days: each learner's latest run and latest review.
	const runs = await db.query<{
		user_id: string;
		last_day: string;
		length: unknown;
		last_at: unknown;
	}>(
		`WITH days AS (
		   SELECT r.user_id, r.day, MAX(r.reviewed_at) AS last_at ${scopeJoin}
		    GROUP BY r.user_id, r.day),
		 numbered AS (
		   SELECT user_id, day, last_at,
		          ${dayNumberSql('day')} - ROW_NUMBER() OVER (PARTITION BY user_id ORDER BY day) AS run
		     FROM days),
		 islands AS (
		   SELECT user_id, MAX(day) AS last_day, COUNT(*) AS length, MAX(last_at) AS last_at
		     FROM numbered GROUP BY user_id, run),
		 ranked AS (
		   SELECT user_id, last_day, length, last_at,
		          ROW_NUMBER() OVER (PARTITION BY user_id ORDER BY last_day DESC) AS rn
		     FROM islands)
		 SELECT user_id, last_day, length, last_at FROM ranked WHERE rn = 1`,
		{ replacements, type: select }
	);
	for (const run of runs) {
		const row = rows.get(run.user_id);
		const t = today.get(run.user_id);
		if (!row || !t) continue;
		row.lastPracticeAt = isoOrNull(run.last_at);
		const gap = daysBetween(run.last_day, t);
		// Today still open: a run that reached yesterday is still alive.
		row.streak = gap <= 1 ? num(run.length) : 0;
	}

	// 4. Cards: due now, and tempo reached against the target.
	const cards = await db.query<{
		user_id: string;
		due: unknown;
		started: unknown;
		tempo_share: unknown;
	}>(
		`SELECT c.user_id,
		        SUM(CASE WHEN c.due <= :now THEN 1 ELSE 0 END) AS due,
		        COUNT(*) AS started,
		        AVG(CASE WHEN c.tempo IS NULL THEN 0.0
		                 WHEN c.tempo >= COALESCE(a.target_tempo, l.tempo) THEN 1.0
		                 ELSE c.tempo * 1.0 / COALESCE(a.target_tempo, l.tempo) END) AS tempo_share
		   FROM cards c
		   JOIN assignments a ON a.id = c.assignment_id
		   JOIN licks l ON l.id = c.lick_id
		  WHERE c.user_id IN (:userIds) AND c.assignment_id IN (:assignmentIds) AND c.state > 0
		  GROUP BY c.user_id`,
		{ replacements, type: select }
	);
	for (const c of cards) {
		const row = rows.get(c.user_id);
		if (!row) continue;
		row.dueNow = num(c.due);
		row.cardsStarted = num(c.started);
		row.tempoReached = row.cardsStarted > 0 ? num(c.tempo_share) : null;
	}
	return [...rows.values()];
}

function compareRows(sort: ProgressSort, dir: 1 | -1) {
	return (a: ProgressRow, b: ProgressRow): number => {
		const x = a[sort];
		const y = b[sort];
		// Missing values (never practised, no retention yet) go last whichever the direction.
		if (x === null && y !== null) return 1;
		if (y === null && x !== null) return -1;
		let order = 0;
		if (typeof x === 'string' && typeof y === 'string') order = x.localeCompare(y);
		else if (typeof x === 'number' && typeof y === 'number') order = x - y;
		return order * dir || a.name.localeCompare(b.name) || a.userId.localeCompare(b.userId);
	};
}

/**
 * The progress table of the actor's class, sorted, optionally for one of its assignments.
 * @example await classProgress(teacher, classId, { sort: 'streak', dir: 'desc' }) // { ok: true, items: [{ name: 'Theo Marsh', streak: 21, … }], total: 3 }
 */
export async function classProgress(
	actor: Actor,
	classId: unknown,
	query: ProgressQuery = {},
	now = new Date()
): Promise<
	Result<{
		items: ProgressRow[];
		total: number;
		sort: ProgressSort;
		dir: 'asc' | 'desc';
		assignmentId: string | null;
	}>
> {
	const cls = await ownClass(actor, classId);
	if (!cls) return classNotFound;
	const sort = query.sort ?? 'name';
	if (typeof sort !== 'string' || !(PROGRESS_SORTS as readonly string[]).includes(sort)) {
		return invalid('sort', `Sort by one of ${PROGRESS_SORTS.join(', ')}.`);
	}
	const dir = query.dir ?? (sort === 'name' ? 'asc' : 'desc');
	if (dir !== 'asc' && dir !== 'desc') return invalid('dir', 'Send dir as asc or desc.');
	let assignmentIds = await assignmentIdsOf(cls.id);
	let assignmentId: string | null = null;
	if (
		query.assignmentId !== undefined &&
		query.assignmentId !== null &&
		query.assignmentId !== ''
	) {
		if (typeof query.assignmentId !== 'string' || !assignmentIds.includes(query.assignmentId)) {
			return invalid('assignment', 'No such assignment in this class.');
		}
		assignmentId = query.assignmentId;
		assignmentIds = [assignmentId];
	}
	const members = await getDb().query<{ user_id: string }>(
		'SELECT user_id FROM class_members WHERE class_id = :classId',
		{ replacements: { classId: cls.id }, type: QueryTypes.SELECT }
	);
	const userIds = members.map((m) => m.user_id);
	const clocks = await clocksOf(userIds);
	const items = await computeProgress({ userIds, assignmentIds }, clocks, now);
	items.sort(compareRows(sort as ProgressSort, dir === 'asc' ? 1 : -1));
	return { ok: true, items, total: items.length, sort: sort as ProgressSort, dir, assignmentId };
}

/** The CSV columns of the export, in order. */
export const PROGRESS_CSV_COLUMNS = [
	{ key: 'name', header: 'learner' },
	{ key: 'lastPracticeAt', header: 'last practice (UTC)' },
	{ key: 'doneToday', header: 'done today' },
	{ key: 'dueNow', header: 'due now' },
	{ key: 'streak', header: 'streak (days)' },
	{ key: 'retention', header: 'retention (30 days)' },
	{ key: 'reviewsThisWeek', header: 'reviews this week' },
	{ key: 'minutesThisWeek', header: 'minutes this week' },
	{ key: 'weakestKeys', header: 'weakest keys' },
	{ key: 'tempoReached', header: 'tempo reached (share of target)' }
] as const;

/** One progress row as CSV cells (shares as decimals with two places, keys space-separated). */
export function progressCsvRecord(row: ProgressRow): (string | number)[] {
	return PROGRESS_CSV_COLUMNS.map(({ key }) => {
		const value = row[key];
		if (value === null) return '';
		if (Array.isArray(value)) return value.join(' ');
		// A name opening with = + - @ would run as a formula in a spreadsheet: quote it as text.
		if (typeof value === 'string' && /^[=+\-@\t\r]/.test(value)) return `'${value}`;
		if (key === 'retention' || key === 'tempoReached') return (value as number).toFixed(2);
		return value;
	});
}
