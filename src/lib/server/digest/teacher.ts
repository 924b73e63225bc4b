import type { Transaction } from 'sequelize';
import { addDays, dayBounds, practiceDay } from '../../practice/day';
import { weakestKeys, type WeakKey } from '../../practice/digest';
import type { MailRecipient } from './learner';
import { selectRows, toDate, toNumber } from './sql';

/**
 * What a teacher's weekly summary says about each of their classes over the seven practice days
 * before the summary's day: who practised, who fell behind and since when, the class's weakest
 * keys, and learners' comments still waiting for the teacher's answer.
 */

export interface ClassWeek {
	name: string;
	members: number;
	practised: { name: string; days: number; reviews: number }[];
	behind: { name: string; overdue: number; newWaiting: number; since: string }[];
	weakKeys: WeakKey[];
	waiting: { learnerName: string; lickTitle: string; text: string; day: string }[];
}

export interface TeacherSummary {
	/** The summary's practice day; the week is the seven days before it. */
	day: string;
	weekStart: string;
	weekEnd: string;
	classes: ClassWeek[];
}

/** Whether a summary has anything to report: at least one class with learners in it. */
export function summaryWorthSending(summary: TeacherSummary): boolean {
	return summary.classes.some((c) => c.members > 0);
}

/** Days of class history the weak keys are read from. */
const WEAK_KEY_DAYS = 28;

/**
 * The summary of practice `day` for a teacher.
 * @example await gatherTeacherSummary(teacher, '2026-03-02') // { classes: [{ name: 'Tuesday combo', … }] }
 */
export async function gatherTeacherSummary(
	who: MailRecipient,
	day: string,
	transaction?: Transaction
): Promise<TeacherSummary> {
	const weekStart = addDays(day, -7);
	const weekEnd = addDays(day, -1);
	const { start: dayStartsAt } = dayBounds(day, who.timezone, who.dayStartHour);
	const classes = await selectRows<{ id: string; name: string }>(
		`SELECT id, name FROM classes WHERE teacher_id = :teacher AND archived_at IS NULL
		 ORDER BY name, id`,
		{ teacher: who.id },
		transaction
	);
	const weeks: ClassWeek[] = [];
	for (const group of classes) {
		const members = await selectRows<{ id: string; name: string; joined_at: unknown }>(
			`SELECT u.id, u.name, m.joined_at FROM class_members m JOIN users u ON u.id = m.user_id
			 WHERE m.class_id = :class ORDER BY u.name, u.id`,
			{ class: group.id },
			transaction
		);
		if (members.length === 0) {
			weeks.push({
				name: group.name,
				members: 0,
				practised: [],
				behind: [],
				weakKeys: [],
				waiting: []
			});
			continue;
		}
		const ids = members.map((m) => m.id);
		const activity = await selectRows<{ user_id: string; days: unknown; reviews: unknown }>(
			`SELECT user_id, COUNT(DISTINCT day) AS days, COUNT(*) AS reviews FROM reviews
			 WHERE user_id IN (:ids) AND undone_at IS NULL AND day >= :from AND day <= :to
			 GROUP BY user_id`,
			{ ids, from: weekStart, to: weekEnd },
			transaction
		);
		// Behind: the class's licks overdue from before today (since the oldest one fell due),
		// or, for someone who did not practise all week, new licks waiting since their start.
		const overdue = await selectRows<{ user_id: string; n: unknown; oldest: unknown }>(
			`SELECT c.user_id, COUNT(*) AS n, MIN(c.due) AS oldest FROM cards c
			 JOIN assignments a ON a.id = c.assignment_id
			 WHERE a.class_id = :class AND c.state > 0 AND c.due < :before AND c.user_id IN (:ids)
			 GROUP BY c.user_id`,
			{ class: group.id, before: dayStartsAt, ids },
			transaction
		);
		const fresh = await selectRows<{ user_id: string; n: unknown; since: string }>(
			`SELECT c.user_id, COUNT(*) AS n, MIN(a.start_date) AS since FROM cards c
			 JOIN assignments a ON a.id = c.assignment_id
			 WHERE a.class_id = :class AND c.state = 0 AND c.introduced_day IS NULL
			   AND c.retired_at IS NULL AND a.paused_at IS NULL AND a.start_date < :day
			   AND c.user_id IN (:ids)
			 GROUP BY c.user_id`,
			{ class: group.id, day, ids },
			transaction
		);
		const tallies = await selectRows<{ key: string; reviews: unknown; grade_sum: unknown }>(
			`SELECT r.key, COUNT(*) AS reviews, SUM(r.grade) AS grade_sum
			 FROM reviews r JOIN cards c ON c.id = r.card_id
			 JOIN assignments a ON a.id = c.assignment_id
			 WHERE a.class_id = :class AND r.undone_at IS NULL AND r.day > :since AND r.day < :day
			   AND r.user_id IN (:ids)
			 GROUP BY r.key`,
			{ class: group.id, since: addDays(day, -WEAK_KEY_DAYS), day, ids },
			transaction
		);
		// A thread waits for an answer when its newest comment is the learner's own.
		const waiting = await selectRows<{
			learner_name: string;
			lick_title: string;
			text: string;
			created_at: unknown;
		}>(
			`SELECT u.name AS learner_name, l.title AS lick_title, co.text, co.created_at
			 FROM comments co
			 JOIN cards c ON c.id = co.card_id
			 JOIN assignments a ON a.id = c.assignment_id
			 JOIN users u ON u.id = c.user_id
			 JOIN licks l ON l.id = c.lick_id
			 WHERE a.class_id = :class AND co.author_id = c.user_id AND c.user_id IN (:ids)
			   AND NOT EXISTS (SELECT 1 FROM comments later
			     WHERE later.card_id = co.card_id AND later.created_at > co.created_at)
			 ORDER BY co.created_at LIMIT 20`,
			{ class: group.id, ids },
			transaction
		);

		const nameOf = new Map(members.map((m) => [m.id, m.name]));
		const practised = activity
			.map((a) => ({
				name: nameOf.get(a.user_id)!,
				days: toNumber(a.days),
				reviews: toNumber(a.reviews)
			}))
			.sort((a, b) => b.days - a.days || b.reviews - a.reviews || a.name.localeCompare(b.name));
		const active = new Set(activity.map((a) => a.user_id));
		const behind: ClassWeek['behind'] = [];
		for (const member of members) {
			const late = overdue.find((o) => o.user_id === member.id);
			const unstarted = fresh.find((f) => f.user_id === member.id);
			if (late) {
				const oldest = toDate(late.oldest);
				behind.push({
					name: member.name,
					overdue: toNumber(late.n),
					newWaiting: toNumber(unstarted?.n),
					since: oldest ? practiceDay(oldest, who.timezone, who.dayStartHour) : weekStart
				});
			} else if (unstarted && !active.has(member.id)) {
				behind.push({
					name: member.name,
					overdue: 0,
					newWaiting: toNumber(unstarted.n),
					since: unstarted.since
				});
			}
		}
		behind.sort((a, b) => a.since.localeCompare(b.since) || a.name.localeCompare(b.name));
		weeks.push({
			name: group.name,
			members: members.length,
			practised,
			behind,
			weakKeys: weakestKeys(
				tallies.map((t) => ({
					key: t.key,
					reviews: toNumber(t.reviews),
					gradeSum: toNumber(t.grade_sum)
				}))
			),
			waiting: waiting.map((w) => {
				const at = toDate(w.created_at);
				return {
					learnerName: w.learner_name,
					lickTitle: w.lick_title,
					text: w.text,
					day: at ? practiceDay(at, who.timezone, who.dayStartHour) : day
				};
			})
		});
	}
	return { day, weekStart, weekEnd, classes: weeks };
}
