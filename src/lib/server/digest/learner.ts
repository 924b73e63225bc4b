import type { Transaction } from 'sequelize';
import { encouragementFor, type WeakKey } from '../../practice/digest';
import { keyStrengths, learnerStreak } from '../study/progress';
import { todayCounts } from '../study/today';
import { selectRows, toDate, toNumber } from './sql';

/**
 * What one learner's daily reminder says: the drill's own figures for today (its queue's due and
 * new licks and minutes, the streak, the key strengths), and what their teachers added since the
 * last reminder that went out.
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
	streak: { days: number; practisedToday: boolean };
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

/** When no reminder was sent before, teacher news from the last week. */
const FIRST_NEWS_DAYS = 7;

/**
 * Everything a learner's reminder for practice `day` says, as of `now`. The drill's figures are
 * read outside `transaction` (they are reads, and SQLite's WAL lets them run beside the claim).
 * @example await gatherLearnerDigest(recipient, '2026-03-02', now) // { reviewsDue: 12, newLicks: 3, … }
 */
export async function gatherLearnerDigest(
	who: MailRecipient,
	day: string,
	now: Date,
	transaction?: Transaction
): Promise<LearnerDigest> {
	const [today, streak, keys, news] = await Promise.all([
		todayCounts(who.id, now),
		learnerStreak(who.id, now),
		keyStrengths(who.id, now),
		gatherTeacherNews(who.id, now, transaction)
	]);
	const weakKeys: WeakKey[] = keys
		.filter((k) => k.strength !== null && k.strength < 1)
		.map((k) => ({ key: k.key, reviews: k.reviews, strength: k.strength! }))
		.sort((a, b) => a.strength - b.strength || b.reviews - a.reviews)
		.slice(0, 3);
	return {
		day,
		reviewsDue: today.due,
		newLicks: today.new,
		minutes: today.estimatedMinutes,
		timedFromOwn: today.timed,
		news,
		streak: { days: streak.current, practisedToday: today.doneToday > 0 },
		weakKeys,
		hasHistory: keys.some((k) => k.reviews > 0),
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
	const since = toDate(last?.at) ?? new Date(now.getTime() - FIRST_NEWS_DAYS * 24 * 60 * 60 * 1000);
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
