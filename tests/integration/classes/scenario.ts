import { Card } from '../../../src/lib/server/db/models/index';
import { createAssignment } from '../../../src/lib/server/classes/assignments';
import { createClass } from '../../../src/lib/server/classes/classes';
import { joinByCode } from '../../../src/lib/server/classes/members';
import { addDays } from '../../../src/lib/practice/day';
import { addReview, introduce, makeDeck, makeUser } from './world';

/**
 * A small class with a known review log, built the same way on any database:
 * - Ada practised every day from 1 to 10 March: each day Lick 1 in C (recalled) and Lick 2 in Gb
 *   (forgotten), plus a review of a card of her own and one she undid (neither counts);
 * - Ben practised on 5, 6 and 8 March, Lick 1 in F# (recalled, grade 2);
 * - Cy never practised.
 * "Now" is 10 March 2026, 12:00 UTC; everyone is in UTC with the day starting at 4.
 */
export const SCENARIO_NOW = new Date('2026-03-10T12:00:00Z');

export async function buildScenario() {
	const teacher = await makeUser('teacher', 'Rosa Scenario');
	const created = await createClass(teacher, { name: 'Scenario class' });
	if (!created.ok) throw new Error(created.message);
	const classId = created.class.id;
	const { deck, licks } = await makeDeck(teacher.id, 2);
	const spare = await makeDeck(teacher.id, 1, 'Spare deck', 'Spare lick');
	const ada = await makeUser('learner', 'Ada Steady');
	const ben = await makeUser('learner', 'Ben Patchy');
	const cy = await makeUser('learner', 'Cy Quiet');
	for (const person of [ada, ben, cy]) await joinByCode(person, created.class.code);
	const main = await createAssignment(
		teacher,
		classId,
		{ deckId: deck.id, startDate: '2026-02-28', newPerDay: 2, targetTempo: 100 },
		new Date('2026-02-28T10:00:00Z')
	);
	const other = await createAssignment(teacher, classId, {
		deckId: spare.deck.id,
		startDate: '2026-03-01',
		newPerDay: 1
	});
	if (!main.ok || !other.ok) throw new Error('assignments refused');
	const card = async (userId: string, lickIndex: number) =>
		(await Card.findOne({
			where: { userId, lickId: licks[lickIndex].id, assignmentId: main.assignment.id }
		}))!;

	const [a0, a1] = [await card(ada.id, 0), await card(ada.id, 1)];
	await introduce(a0, '2026-02-28', new Date('2026-03-10T11:00:00Z'), 120);
	await introduce(a1, '2026-02-28', new Date('2026-03-12T00:00:00Z'), 60);
	for (let d = 0; d < 10; d++) {
		const day = addDays('2026-03-01', d);
		await addReview(a0, new Date(`${day}T10:00:00Z`), day, 3, 'C');
		await addReview(a1, new Date(`${day}T11:00:00Z`), day, 1, 'Gb');
	}
	const own = await Card.create({
		userId: ada.id,
		lickId: spare.licks[0].id,
		quality: 'm7',
		due: SCENARIO_NOW,
		state: 2
	});
	await addReview(own, new Date('2026-03-10T11:30:00Z'), '2026-03-10', 1, 'E');
	const b0 = await card(ben.id, 0);
	await introduce(b0, '2026-03-05', new Date('2026-03-09T00:00:00Z'));
	for (const day of ['2026-03-05', '2026-03-06', '2026-03-08']) {
		await addReview(b0, new Date(`${day}T20:00:00Z`), day, 2, 'F#');
	}
	const undone = await card(ada.id, 0);
	await addReview(undone, new Date('2026-03-10T11:45:00Z'), '2026-03-10', 4, 'D');
	const { Review } = await import('../../../src/lib/server/db/models/index');
	await Review.update({ undoneAt: SCENARIO_NOW }, { where: { cardId: undone.id, key: 'D' } });
	return {
		teacher,
		classId,
		ada,
		ben,
		cy,
		mainId: main.assignment.id,
		otherId: other.assignment.id
	};
}

/** Rows without ids, for comparing runs on two databases. */
export function comparable<T extends { userId: string }>(rows: T[]) {
	return rows.map(({ userId: _userId, ...rest }) => rest);
}

/** The progress rows the scenario must give on every database, by name. */
export const expectedRows = [
	{
		name: 'Ada Steady',
		lastPracticeAt: '2026-03-10T11:00:00.000Z',
		doneToday: 2,
		dueNow: 1,
		streak: 10,
		retention: 0.5,
		reviewsThisWeek: 14,
		minutesThisWeek: 7,
		weakestKeys: ['Gb'],
		// Lick 1 at 120 of a 100 target counts as reached; Lick 2 at 60 is 0.6 of it.
		tempoReached: 0.8,
		cardsStarted: 2
	},
	{
		name: 'Ben Patchy',
		lastPracticeAt: '2026-03-08T20:00:00.000Z',
		doneToday: 0,
		dueNow: 1,
		streak: 0,
		// Only the 6 and 8 March reviews count: on 5 March the lick was brand new.
		retention: 1,
		reviewsThisWeek: 3,
		minutesThisWeek: 2,
		weakestKeys: [],
		tempoReached: 0,
		cardsStarted: 1
	},
	{
		name: 'Cy Quiet',
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
	}
];
