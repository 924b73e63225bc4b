/**
 * A learner's progress: streak calendar, reviews per day, measured retention against the target
 * by card maturity, strength per key, tempo reached per lick, and the coming fortnight's load.
 * Also the small figures other features reuse (the digest, the teacher's class page): due
 * counts, the streak, the weakest keys.
 */
import { QueryTypes } from 'sequelize';
import { getDb } from '../db/index';
import type { ProgressAnswer } from '../../practice/api';
import { addDays, practiceDay } from '../../practice/day';
import { keyPitchClass, TWELVE_KEYS } from '../../practice/keys';
import { streakOf } from '../../practice/streak';
import { StudyError } from './cards';
import { learnerDay, loadLearner, type Actor, type Learner } from './learner';
import { rowDate } from './today';

const select = <T extends object>(sql: string, replacements: Record<string, unknown>) =>
	getDb().query<T>(sql, { replacements, type: QueryTypes.SELECT });

async function requireLearner(actor: Actor | string): Promise<Learner> {
	const learner = await loadLearner(actor);
	if (!learner) throw new StudyError(404, 'No such learner.');
	return learner;
}

/** Interval (days) from which a card counts as mature (common practice in spaced repetition). */
export const MATURE_DAYS = 21;

/**
 * Cards due today (due before the practice day ends, new cards left out), new cards waiting
 * (not retired), and cards introduced today. For the digest and the class page; `userId` is the
 * learner's own id (callers check access).
 * @example await dueCounts(userId, new Date()) // { day: '2026-03-01', due: 12, waitingNew: 30, introducedToday: 3 }
 */
export async function dueCounts(
	userId: string,
	now: Date
): Promise<{ day: string; due: number; waitingNew: number; introducedToday: number }> {
	const learner = await requireLearner(userId);
	const { day, end } = learnerDay(learner, now);
	const [row] = await select<{ due: number; fresh: number; introduced: number }>(
		`SELECT SUM(CASE WHEN state <> 0 AND due < :end THEN 1 ELSE 0 END) AS due,
		        SUM(CASE WHEN state = 0 AND retired_at IS NULL THEN 1 ELSE 0 END) AS fresh,
		        SUM(CASE WHEN introduced_day = :day THEN 1 ELSE 0 END) AS introduced
		 FROM cards WHERE user_id = :id`,
		{ id: userId, end, day }
	);
	return {
		day,
		due: Number(row?.due ?? 0),
		waitingNew: Number(row?.fresh ?? 0),
		introducedToday: Number(row?.introduced ?? 0)
	};
}

/** @example await learnerStreak(userId, new Date()) // { current: 4, longest: 9 } */
export async function learnerStreak(
	userId: string,
	now: Date
): Promise<{ current: number; longest: number }> {
	const learner = await requireLearner(userId);
	const rows = await select<{ day: string }>(
		'SELECT DISTINCT day FROM reviews WHERE user_id = :id AND undone_at IS NULL',
		{ id: userId }
	);
	return streakOf(
		rows.map((r) => r.day),
		learnerDay(learner, now).day
	);
}

/**
 * Strength per concert key over the last 90 days: mean grade mapped to 0–1 (grade 1 → 0,
 * grade 4 → 1); null for a key not played. Weakest first with `weakestKeys`.
 */
export async function keyStrengths(userId: string, now: Date): Promise<ProgressAnswer['keys']> {
	const learner = await requireLearner(userId);
	const since = addDays(learnerDay(learner, now).day, -90);
	const rows = await select<{ key: string; n: number; total: number; last_day: string }>(
		`SELECT key, COUNT(*) AS n, SUM(grade) AS total, MAX(day) AS last_day FROM reviews
		 WHERE user_id = :id AND undone_at IS NULL AND day >= :since GROUP BY key`,
		{ id: userId, since }
	);
	return TWELVE_KEYS.map((key) => {
		const pc = keyPitchClass(key);
		const same = rows.filter((r) => keyPitchClass(r.key) === pc);
		const n = same.reduce((s, r) => s + Number(r.n), 0);
		const total = same.reduce((s, r) => s + Number(r.total), 0);
		const lastDay =
			same
				.map((r) => r.last_day)
				.sort()
				.at(-1) ?? null;
		return { key, reviews: n, strength: n ? (total / n - 1) / 3 : null, lastDay };
	});
}

/**
 * The `count` weakest keys played in the last 90 days (lowest strength first).
 * @example await weakestKeys(userId, new Date(), 3) // ['Gb', 'B', 'E']
 */
export async function weakestKeys(userId: string, now: Date, count = 3): Promise<string[]> {
	return (await keyStrengths(userId, now))
		.filter((k) => k.strength !== null)
		.sort((a, b) => a.strength! - b.strength! || b.reviews - a.reviews)
		.slice(0, count)
		.map((k) => k.key);
}

/**
 * `GET /api/drill/progress` for the actor.
 * @example await buildProgress(me, new Date()) // { streak, calendar, retention, keys, … }
 */
export async function buildProgress(actor: Actor, now: Date): Promise<ProgressAnswer> {
	const learner = await requireLearner(actor);
	const { day: today } = learnerDay(learner, now);
	const since = addDays(today, -364);
	const [perDay, reviews, cards, licks, keys] = await Promise.all([
		select<{ day: string; n: number; passed: number }>(
			`SELECT day, COUNT(*) AS n, SUM(CASE WHEN grade >= 2 THEN 1 ELSE 0 END) AS passed
			 FROM reviews WHERE user_id = :id AND undone_at IS NULL AND day >= :since GROUP BY day`,
			{ id: learner.id, since }
		),
		select<{ grade: number; state_before: string }>(
			`SELECT grade, state_before FROM reviews WHERE user_id = :id AND undone_at IS NULL
			 AND day >= :since`,
			{ id: learner.id, since }
		),
		select<{ state: number; due: unknown; retired_at: unknown }>(
			'SELECT state, due, retired_at FROM cards WHERE user_id = :id',
			{ id: learner.id }
		),
		select<{
			lick_id: string;
			title: string;
			tempo: number | null;
			lick_tempo: number;
			target: number | null;
		}>(
			`SELECT c.lick_id, l.title, MAX(c.tempo) AS tempo, l.tempo AS lick_tempo, MAX(a.target_tempo) AS target
			 FROM cards c JOIN licks l ON l.id = c.lick_id LEFT JOIN assignments a ON a.id = c.assignment_id
			 WHERE c.user_id = :id GROUP BY c.lick_id, l.title, l.tempo ORDER BY l.title`,
			{ id: learner.id }
		),
		keyStrengths(learner.id, now)
	]);

	const byDay = new Map(perDay.map((r) => [r.day, r]));
	const reviewsPerDay: ProgressAnswer['reviewsPerDay'] = [];
	for (let i = 29; i >= 0; i--) {
		const day = addDays(today, -i);
		const r = byDay.get(day);
		reviewsPerDay.push({ day, reviews: Number(r?.n ?? 0), passed: Number(r?.passed ?? 0) });
	}

	const buckets = { learning: [0, 0], young: [0, 0], mature: [0, 0] };
	for (const r of reviews) {
		let before: { state?: number; scheduledDays?: number };
		try {
			before = JSON.parse(r.state_before);
		} catch {
			continue;
		}
		const bucket =
			before.state !== 2
				? buckets.learning
				: (before.scheduledDays ?? 0) >= MATURE_DAYS
					? buckets.mature
					: buckets.young;
		bucket[0]++;
		if (Number(r.grade) >= 2) bucket[1]++;
	}

	const forecast: ProgressAnswer['forecast'] = [];
	const dueOn = new Map<string, number>();
	let total = 0;
	const counts = { new: 0, learning: 0, review: 0 };
	for (const c of cards) {
		const state = Number(c.state);
		if (state === 0) {
			if (c.retired_at === null || c.retired_at === undefined) counts.new++;
			else continue;
		} else if (state === 2) counts.review++;
		else counts.learning++;
		total++;
		if (state === 0) continue;
		const d = practiceDay(rowDate(c.due), learner.timeZone, learner.dayStartHour);
		const key = d < today ? today : d;
		dueOn.set(key, (dueOn.get(key) ?? 0) + 1);
	}
	for (let i = 0; i < 14; i++) {
		const day = addDays(today, i);
		forecast.push({ day, due: dueOn.get(day) ?? 0 });
	}

	return {
		today,
		streak: streakOf(
			perDay.map((r) => r.day),
			today
		),
		calendar: perDay
			.map((r) => ({ day: r.day, reviews: Number(r.n) }))
			.sort((a, b) => a.day.localeCompare(b.day)),
		reviewsPerDay,
		retention: {
			target: learner.desiredRetention,
			byMaturity: (['learning', 'young', 'mature'] as const).map((maturity) => {
				const [n, passed] = buckets[maturity];
				return { maturity, reviews: n, passed, rate: n ? passed / n : null };
			})
		},
		keys,
		tempos: licks.map((l) => ({
			lickId: l.lick_id,
			title: l.title,
			tempo: l.tempo === null ? null : Number(l.tempo),
			targetTempo: Number(l.target ?? l.lick_tempo)
		})),
		forecast,
		cards: { total, ...counts }
	};
}
