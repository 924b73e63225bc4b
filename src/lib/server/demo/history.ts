/**
 * A few weeks of simulated practice for the demo school, run through the real services: the
 * teacher's class and assignments through the class services, every sitting's queue through the
 * drill's `buildToday` and every grade through `recordReview`, so the scheduler, the tempo ladder
 * and the key picking decide everything, as they would for real people. The learners' choices
 * (whether they practise today, how well they remember, which keys they fumble) are drawn from
 * seeded randomness, so every seed gives the same history.
 *
 * Three habits: Theo (guitar) practises nearly every evening; Sam (trumpet) comes in bursts with
 * gaps; Ines (alto) practises often but fumbles the keys with many sharps, which her weighted key
 * order then brings back to her all the more.
 */
import { ClassGroup, User } from '../db/models/index';

import { createAssignment } from '../classes/assignments';
import { createClass } from '../classes/classes';
import { postComment } from '../classes/comments';
import { joinClass } from '../classes/members';
import { pitchClassOf } from '../classes/keys';
import { addDays, dayStart, practiceDay } from '../../practice/day';
import { seededRandom } from '../../practice/random';
import type { GradeValue } from '../../practice/api';
import { buildToday } from '../study/today';
import { recordReview } from '../study/reviews';
import { settingsOf } from '../study/settings';
import type { Role } from '../db/models/index';

export const DEMO_CLASS_NAME = 'Tuesday evening combo';
/** Days of history before the seeding day. The second deck starts six days before it, at one new
 * card a day over two qualities, so every demo learner still has new licks waiting on first start. */
export const HISTORY_DAYS = 24;

interface Habit {
	email: string;
	/** Chance of practising on a given day (Sam's depends on yesterday: bursts and gaps). */
	practise: (random: () => number, practisedYesterday: boolean) => boolean;
	/** Local hour of the sitting. */
	hour: number;
	/** Weights of grades 1–4 for a key (the sharp-key avoider fumbles some keys). */
	grades: (key: string) => readonly number[];
}

// Keys written with four or more sharps in the usual jazz spelling (E, B, F#) plus A's three:
// the ones a horn player used to flat keys tends to dodge (common practice).
const SHARP_KEYS = new Set([4, 11, 6, 9]);

const HABITS: readonly Habit[] = [
	{
		email: 'guitar@example.com',
		practise: (random) => random() < 0.92,
		hour: 19,
		grades: () => [0.07, 0.15, 0.58, 0.2]
	},
	{
		email: 'alto@example.com',
		practise: (random) => random() < 0.8,
		hour: 21,
		grades: (key) =>
			SHARP_KEYS.has(pitchClassOf(key) ?? -1) ? [0.55, 0.3, 0.15, 0] : [0.06, 0.14, 0.6, 0.2]
	},
	{
		email: 'trumpet@example.com',
		practise: (random, yesterday) => random() < (yesterday ? 0.6 : 0.15),
		hour: 18,
		grades: () => [0.18, 0.27, 0.45, 0.1]
	}
];

function draw(weights: readonly number[], random: () => number): GradeValue {
	const total = weights.reduce((a, b) => a + b, 0);
	let r = random() * total;
	for (let i = 0; i < weights.length; i++) {
		r -= weights[i];
		if (r < 0) return (i + 1) as GradeValue;
	}
	return 4;
}

export interface HistoryReport {
	skipped: boolean;
	reviews: number;
	sittings: number;
}

/**
 * Create the demo class with its two assignments and the learners' history, unless the demo
 * teacher already has the class (seeding twice adds nothing).
 * @example await seedDemoHistory(new Date('2026-03-25T12:00:00Z')) // { skipped: false, reviews: 612, sittings: 58 }
 */
export async function seedDemoHistory(
	teacherEmail: string,
	deckIds: readonly string[],
	now = new Date(),
	seed = 'lantern-street'
): Promise<HistoryReport> {
	const teacherRow = await User.findOne({ where: { email: teacherEmail } });
	if (!teacherRow || deckIds.length < 2) return { skipped: true, reviews: 0, sittings: 0 };
	if (await ClassGroup.findOne({ where: { teacherId: teacherRow.id, name: DEMO_CLASS_NAME } })) {
		return { skipped: true, reviews: 0, sittings: 0 };
	}
	const teacher = { id: teacherRow.id, role: teacherRow.role as Role, name: teacherRow.name };
	const firstDay = addDays(practiceDay(now, 'UTC', 4), -HISTORY_DAYS);
	const start = dayStart(firstDay, 'UTC', 8);
	const created = await createClass(teacher, { name: DEMO_CLASS_NAME });
	if (!created.ok) throw new Error(`Demo class: ${created.message}`);
	const cls = (await ClassGroup.findByPk(created.class.id))!;

	const learners: { user: User; habit: Habit }[] = [];
	for (const habit of HABITS) {
		const user = await User.findOne({ where: { email: habit.email } });
		if (!user) continue;
		await joinClass(user.id, cls, start);
		learners.push({ user, habit });
	}
	const first = await createAssignment(
		teacher,
		cls.id,
		{ deckId: deckIds[0], startDate: firstDay, newPerDay: 2 },
		start
	);
	const second = await createAssignment(
		teacher,
		cls.id,
		{
			deckId: deckIds[1],
			startDate: addDays(firstDay, HISTORY_DAYS - 6),
			newPerDay: 1,
			qualities: ['m7'],
			targetTempo: 132
		},
		start
	);
	if (!first.ok || !second.ok) throw new Error('Demo assignments were refused');

	let reviews = 0;
	let sittings = 0;
	for (const { user, habit } of learners) {
		const random = seededRandom(`${seed}:${habit.email}`);
		const zone = settingsOf(user).timezone;
		let yesterday = true;
		for (let d = 0; d < HISTORY_DAYS; d++) {
			const day = addDays(firstDay, d);
			const practised = habit.practise(random, yesterday);
			yesterday = practised;
			if (!practised) continue;
			let at = new Date(
				dayStart(day, zone, habit.hour).getTime() + Math.floor(random() * 40) * 60_000
			);
			if (at.getTime() >= now.getTime()) break;
			const today = await buildToday({ id: user.id }, at);
			sittings += 1;
			const sittingId = `demo-${habit.email}-${day}`;
			for (const item of today.items) {
				const grade = draw(habit.grades(item.key), random);
				const revealMs = 15_000 + Math.floor(random() * 45_000);
				const gradeMs = 1_500 + Math.floor(random() * 4_000);
				// A good pass is played at the prompt's tempo; a fumbled one is not counted as played.
				await recordReview(
					{ id: user.id },
					{
						cardId: item.cardId,
						key: item.key,
						quality: item.quality,
						grade,
						tempo: item.tempo,
						revealMs,
						gradeMs,
						clientId: `${sittingId}-${reviews}`,
						reviewedAt: at,
						sittingId
					},
					at
				);
				reviews += 1;
				at = new Date(at.getTime() + revealMs + gradeMs + 20_000);
			}
		}
	}
	await seedDemoComments(
		teacher,
		learners.map((l) => l.user.id)
	);
	return { skipped: false, reviews, sittings };
}

/** A few threads: the teacher on two learners' licks, and one answer. */
async function seedDemoComments(teacher: { id: string; role: Role }, learnerIds: string[]) {
	const { Card } = await import('../db/models/index');
	const notes = [
		'Nice and even in the flat keys. In B, slow the ladder down and sing the enclosure before you play it.',
		'Your E version rushes the leap: land on the ninth first, then add the approach notes back.'
	];
	for (const [i, userId] of [learnerIds[0], learnerIds[2]].entries()) {
		if (!userId) continue;
		const card = await Card.findOne({
			where: { userId, state: 2 },
			order: [
				['lapses', 'DESC'],
				['reps', 'DESC']
			]
		});
		if (!card) continue;
		await postComment(teacher, card.id, { text: notes[i] });
		if (i === 1) {
			await postComment({ id: userId, role: 'learner' }, card.id, {
				text: 'Thanks! E and B are the ones I keep avoiding. Trying it at a slower tempo this week.'
			});
		}
	}
}
