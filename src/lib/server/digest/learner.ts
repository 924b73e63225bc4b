import type { Transaction } from 'sequelize';
import { addDays, dayBounds } from '../../practice/day';
import {
	encouragementFor,
	estimateMinutes,
	streakOn,
	typicalReviewMs,
	weakestKeys,
	type KeyTally,
	type Streak,
	type WeakKey
} from '../../practice/digest';
import { normalizeSettings } from '../../practice/settings';
import { selectRows, toDate, toNumber } from './sql';

/**
 * What one learner's daily reminder says, read from the shared tables: licks due by the end of
 * the practice day, new licks their sources introduce today, timings, streak, weak keys, and
 * what their teachers added since the last reminder.
 */

/** The person a reminder is for, as the scheduler's query finds them. */
export interface MailRecipient {
	id: string;
	name: string;
	email: string;
	timezone: string;
	digestHour: number;
	dayStartHour: number;
	/** The settings JSON as stored (for the learner's own pace of new licks, `newPerDay`). */
	settings: unknown;
}

export interface TeacherNews {
	assignments: { className: string; deckName: string; teacherName: string; newPerDay: number }[];
	comments: { authorName: string; lickTitle: string; quality: string; text: string }[];
}

export interface LearnerDigest {
	day: string;
	/** Cards already learned whose review falls before the practice day ends. */
	reviewsDue: number;
	/** New cards their sources introduce today, at each source's pace. */
	newLicks: number;
	minutes: number;
	/** Whether the minutes come from the learner's own timings rather than a first guess. */
	timedFromOwn: boolean;
	news: TeacherNews;
	streak: Streak;
	weakKeys: WeakKey[];
	/** Whether the learner has any review at all (the weak-keys section says nothing without). */
	hasHistory: boolean;
	encouragement: string;
}

/** Whether a reminder has anything to say: something to practise, or something new. */
export function worthSending(digest: LearnerDigest): boolean {
	return (
		digest.reviewsDue + digest.newLicks > 0 ||
		digest.news.assignments.length + digest.news.comments.length > 0
	);
}

/** Days of history the weak keys are read from. */
const WEAK_KEY_DAYS = 28;
/** Longest streak looked for (a year and a bit). */
const STREAK_LOOKBACK_DAYS = 400;
/** When no reminder was sent before, teacher news from the last week. */
const FIRST_NEWS_DAYS = 7;

/**
 * Everything a learner's reminder for practice `day` says, as of `now`.
 * @example await gatherLearnerDigest(recipient, '2026-03-02', now) // { reviewsDue: 12, newLicks: 3, … }
 */
export async function gatherLearnerDigest(
	who: MailRecipient,
	day: string,
	now: Date,
	transaction?: Transaction
): Promise<LearnerDigest> {
	const { end } = dayBounds(day, who.timezone, who.dayStartHour);
	const u = { user: who.id };

	const [due] = await selectRows<{ n: unknown }>(
		'SELECT COUNT(*) AS n FROM cards WHERE user_id = :user AND state > 0 AND due < :end',
		{ ...u, end },
		transaction
	);

	// New cards, per source: the contract's pace (new_per_day per assignment, the learner's own
	// setting otherwise), at most one card per lick a day, minus what today already introduced.
	const waiting = await selectRows<{ source: string | null; licks: unknown }>(
		`SELECT assignment_id AS source, COUNT(DISTINCT lick_id) AS licks FROM cards
		 WHERE user_id = :user AND state = 0 AND introduced_day IS NULL AND retired_at IS NULL
		 GROUP BY assignment_id`,
		u,
		transaction
	);
	const introduced = await selectRows<{ source: string | null; n: unknown }>(
		`SELECT assignment_id AS source, COUNT(*) AS n FROM cards
		 WHERE user_id = :user AND introduced_day = :day GROUP BY assignment_id`,
		{ ...u, day },
		transaction
	);
	const sourceIds = waiting.map((w) => w.source).filter((s): s is string => s !== null);
	const paces = sourceIds.length
		? await selectRows<{ id: string; pace: unknown; start: string; finish: string | null }>(
				`SELECT a.id, a.new_per_day AS pace, a.start_date AS start, a.end_date AS finish
				 FROM assignments a JOIN classes c ON c.id = a.class_id
				 WHERE a.id IN (:ids) AND a.paused_at IS NULL AND c.archived_at IS NULL`,
				{ ids: sourceIds },
				transaction
			)
		: [];
	const paceOf = new Map<string | null, number>([[null, normalizeSettings(who.settings).newPerDay]]);
	for (const a of paces) {
		if (a.start <= day && (a.finish === null || day <= a.finish)) paceOf.set(a.id, toNumber(a.pace));
	}
	let newLicks = 0;
	for (const w of waiting) {
		const pace = paceOf.get(w.source) ?? 0;
		const already = toNumber(introduced.find((i) => i.source === w.source)?.n);
		newLicks += Math.max(0, Math.min(pace - already, toNumber(w.licks)));
	}

	const timings = await selectRows<{ reveal: unknown; grade: unknown }>(
		`SELECT reveal_ms AS reveal, grade_ms AS grade FROM reviews
		 WHERE user_id = :user AND undone_at IS NULL AND reveal_ms IS NOT NULL
		 ORDER BY reviewed_at DESC LIMIT 60`,
		u,
		transaction
	);
	const msPerReview = typicalReviewMs(timings.map((t) => toNumber(t.reveal) + toNumber(t.grade)));

	const practised = await selectRows<{ day: string }>(
		`SELECT DISTINCT day FROM reviews
		 WHERE user_id = :user AND undone_at IS NULL AND day <= :day AND day > :since`,
		{ ...u, day, since: addDays(day, -STREAK_LOOKBACK_DAYS) },
		transaction
	);

	const tallies = await selectRows<{ key: string; reviews: unknown; misses: unknown; shaky: unknown }>(
		`SELECT key, COUNT(*) AS reviews,
		   SUM(CASE WHEN grade = 1 THEN 1 ELSE 0 END) AS misses,
		   SUM(CASE WHEN grade = 2 THEN 1 ELSE 0 END) AS shaky
		 FROM reviews WHERE user_id = :user AND undone_at IS NULL AND day > :since AND day <= :day
		 GROUP BY key`,
		{ ...u, day, since: addDays(day, -WEAK_KEY_DAYS) },
		transaction
	);
	const [anyReview] = await selectRows<{ n: unknown }>(
		'SELECT COUNT(*) AS n FROM (SELECT 1 FROM reviews WHERE user_id = :user LIMIT 1) AS any_review',
		u,
		transaction
	);

	const news = await gatherTeacherNews(who.id, now, transaction);
	const reviewsDue = toNumber(due?.n);
	return {
		day,
		reviewsDue,
		newLicks,
		minutes: estimateMinutes({ reviews: reviewsDue, newLicks, msPerReview }),
		timedFromOwn: msPerReview !== null,
		news,
		streak: streakOn(
			practised.map((p) => p.day),
			day
		),
		weakKeys: weakestKeys(
			tallies.map(
				(t): KeyTally => ({
					key: t.key,
					reviews: toNumber(t.reviews),
					misses: toNumber(t.misses),
					shaky: toNumber(t.shaky)
				})
			)
		),
		hasHistory: toNumber(anyReview?.n) > 0,
		encouragement: encouragementFor(who.id, day)
	};
}

/**
 * Assignments made in the learner's classes and comments others left on the learner's cards
 * since the last reminder that went out (or the last week, before the first).
 */
async function gatherTeacherNews(
	userId: string,
	now: Date,
	transaction?: Transaction
): Promise<TeacherNews> {
	const [last] = await selectRows<{ at: unknown }>(
		`SELECT MAX(sent_at) AS at FROM mail_sends
		 WHERE user_id = :user AND kind = 'digest' AND status = 'sent'`,
		{ user: userId },
		transaction
	);
	const since =
		toDate(last?.at) ?? new Date(now.getTime() - FIRST_NEWS_DAYS * 24 * 60 * 60 * 1000);
	const assignments = await selectRows<{
		class_name: string;
		deck_name: string;
		teacher_name: string;
		new_per_day: unknown;
	}>(
		`SELECT c.name AS class_name, d.name AS deck_name, t.name AS teacher_name, a.new_per_day
		 FROM assignments a
		 JOIN class_members m ON m.class_id = a.class_id AND m.user_id = :user
		 JOIN classes c ON c.id = a.class_id
		 JOIN decks d ON d.id = a.deck_id
		 JOIN users t ON t.id = c.teacher_id
		 WHERE a.created_at > :since AND a.created_at <= :now AND c.archived_at IS NULL
		 ORDER BY a.created_at`,
		{ user: userId, since, now },
		transaction
	);
	const comments = await selectRows<{
		author_name: string;
		lick_title: string;
		quality: string;
		text: string;
	}>(
		`SELECT au.name AS author_name, l.title AS lick_title, c.quality, co.text
		 FROM comments co
		 JOIN cards c ON c.id = co.card_id
		 JOIN licks l ON l.id = c.lick_id
		 JOIN users au ON au.id = co.author_id
		 WHERE c.user_id = :user AND co.author_id <> :user
		   AND co.created_at > :since AND co.created_at <= :now
		 ORDER BY co.created_at LIMIT 10`,
		{ user: userId, since, now },
		transaction
	);
	return {
		assignments: assignments.map((a) => ({
			className: a.class_name,
			deckName: a.deck_name,
			teacherName: a.teacher_name,
			newPerDay: toNumber(a.new_per_day)
		})),
		comments: comments.map((c) => ({
			authorName: c.author_name,
			lickTitle: c.lick_title,
			quality: c.quality,
			text: c.text
		}))
	};
}
