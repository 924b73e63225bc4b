import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Card, Lick } from '../../../src/lib/server/db/models/index';
import { createAssignment, updateAssignment } from '../../../src/lib/server/classes/assignments';
import { followDeckEdit } from '../../../src/lib/server/classes/class-cards';
import { createClass } from '../../../src/lib/server/classes/classes';
import { joinByCode, leaveClass } from '../../../src/lib/server/classes/members';
import { updateDeck } from '../../../src/lib/server/library/decks';
import { openTestWorld, type TestWorld } from '../support/world';
import { makeDeck, makeUser } from './world';

/**
 * A deck that is already assigned keeps changing: licks added to it reach the classes' members at
 * once, by the rules of the assignment (its qualities, the lick's place in the deck), on a real
 * SQLite file.
 */

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
});
afterAll(() => world.close());

const NOW = new Date('2026-03-02T10:00:00Z');
const LATER = new Date('2026-03-05T10:00:00Z');

async function assignedDeck(qualities: string[] = ['m7'], members = 2) {
	const teacher = await makeUser('teacher');
	const created = await createClass(teacher, { name: 'Harbour trio' });
	if (!created.ok) throw new Error(created.message);
	const { deck, licks } = await makeDeck(teacher.id, 2);
	const learners = [];
	for (let i = 0; i < members; i++) {
		const learner = await makeUser('learner');
		expect((await joinByCode(learner, created.class.code)).ok).toBe(true);
		learners.push(learner);
	}
	const made = await createAssignment(
		teacher,
		created.class.id,
		{ deckId: deck.id, startDate: '2026-03-02', newPerDay: 2, keys: ['C', 'F', 'Bb'], qualities },
		NOW
	);
	if (!made.ok) throw new Error(made.message);
	return { teacher, cls: created.class, deck, licks, learners, assignment: made.assignment };
}

async function newLick(authorId: string, homeQuality = '7') {
	return Lick.create({
		authorId,
		title: 'Added later',
		abc: ['X:1', 'T:Added later', 'M:4/4', 'L:1/8', 'K:F', '"F7"FAcA _edcA|'].join('\n'),
		homeKey: 'F',
		homeQuality,
		tempo: 132
	});
}

function cardsOf(userId: string, lickId?: string) {
	return Card.findAll({
		where: lickId ? { userId, lickId } : { userId },
		order: [['newPosition', 'ASC']]
	});
}

describe('a lick added to an assigned deck', () => {
	test('becomes new cards of every member at once: home quality and the assignment’s, at its place in the deck', async () => {
		const { teacher, deck, licks, learners, assignment } = await assignedDeck(['m7', '7']);
		const lick = await newLick(teacher.id);
		// Put in the middle: its place in the deck is its place in the queue.
		await updateDeck(teacher, deck.id, { lickIds: [licks[0].id, lick.id, licks[1].id] }, LATER);
		for (const learner of learners) {
			const cards = await cardsOf(learner.id, lick.id);
			expect(cards.map((c) => [c.quality, c.newPosition])).toEqual([
				['7', 16],
				['m7', 17]
			]);
			expect(
				cards.every(
					(c) =>
						c.assignmentId === assignment.id &&
						c.state === 0 &&
						c.introducedDay === null &&
						c.retiredAt === null &&
						c.due.getTime() === LATER.getTime()
				)
			).toBe(true);
			// The licks already in the deck keep their cards as they were.
			expect(await Card.count({ where: { userId: learner.id } })).toBe(6);
		}
	});

	test('is idempotent: saving the deck again, reordering it or running the step twice makes no second card', async () => {
		const { teacher, deck, licks, learners } = await assignedDeck();
		const lick = await newLick(teacher.id);
		const order = [licks[0].id, licks[1].id, lick.id];
		await updateDeck(teacher, deck.id, { lickIds: order }, LATER);
		await updateDeck(teacher, deck.id, { lickIds: [...order].reverse() }, LATER);
		await world.db.transaction((transaction) =>
			followDeckEdit(deck.id, order, { added: [lick.id], removed: [] }, LATER, transaction)
		);
		await Promise.all(
			[1, 2, 3].map(() =>
				world.db.transaction((transaction) =>
					followDeckEdit(deck.id, order, { added: [lick.id], removed: [] }, LATER, transaction)
				)
			)
		);
		for (const learner of learners) {
			expect(await Card.count({ where: { userId: learner.id, lickId: lick.id } })).toBe(2);
		}
	});

	test('keeps a card the learner already had of that lick (their own, practised) and adds only what is missing', async () => {
		const { teacher, deck, licks, learners } = await assignedDeck(['m7'], 1);
		const lick = await newLick(teacher.id);
		const own = await Card.create({
			userId: learners[0].id,
			lickId: lick.id,
			quality: '7',
			due: NOW,
			state: 2,
			introducedDay: '2026-03-01'
		});
		await updateDeck(teacher, deck.id, { lickIds: [...licks.map((l) => l.id), lick.id] }, LATER);
		const cards = await cardsOf(learners[0].id, lick.id);
		expect(cards.map((c) => [c.quality, c.state, c.id === own.id]).sort()).toEqual([
			['7', 2, true],
			['m7', 0, false]
		]);
		expect(cards.find((c) => c.id === own.id)!.assignmentId).toBeNull();
	});

	test('reaches every class the deck is assigned to, each by its own qualities', async () => {
		const first = await assignedDeck(['m7'], 1);
		const other = await createClass(first.teacher, { name: 'Second room' });
		if (!other.ok) throw new Error(other.message);
		const learner = await makeUser('learner');
		await joinByCode(learner, other.class.code);
		const second = await createAssignment(
			first.teacher,
			other.class.id,
			{ deckId: first.deck.id, startDate: '2026-03-02', newPerDay: 1, qualities: ['maj7'] },
			NOW
		);
		expect(second.ok).toBe(true);
		const lick = await newLick(first.teacher.id);
		await updateDeck(first.teacher, first.deck.id, {
			lickIds: [...first.licks.map((l) => l.id), lick.id]
		});
		expect((await cardsOf(first.learners[0].id, lick.id)).map((c) => c.quality)).toEqual([
			'7',
			'm7'
		]);
		expect((await cardsOf(learner.id, lick.id)).map((c) => c.quality)).toEqual(['7', 'maj7']);
	});

	test('a deck with no assignment, or a change that adds no lick, makes no card', async () => {
		const teacher = await makeUser('teacher');
		const { deck, licks } = await makeDeck(teacher.id, 2);
		const lick = await newLick(teacher.id);
		const before = await Card.count();
		await updateDeck(teacher, deck.id, { lickIds: [...licks.map((l) => l.id), lick.id] });
		expect(await Card.count()).toBe(before);
		const assigned = await assignedDeck();
		const count = await Card.count();
		await updateDeck(assigned.teacher, assigned.deck.id, {
			lickIds: [assigned.licks[1].id, assigned.licks[0].id]
		});
		await updateDeck(assigned.teacher, assigned.deck.id, { name: 'Renamed' });
		expect(await Card.count()).toBe(count);
	});
});

describe('cards put back to work on rejoining', () => {
	test('a quality dropped from the assignment stays retired when the learner leaves and comes back', async () => {
		const { teacher, cls, learners, assignment } = await assignedDeck(['m7'], 1);
		const [learner] = learners;
		await updateAssignment(teacher, assignment.id, { qualities: [] }, NOW);
		await leaveClass(learner, cls.id, NOW);
		await joinByCode(learner, cls.code);
		const cards = await cardsOf(learner.id);
		expect(cards.map((c) => [c.quality, c.retiredAt === null]).sort()).toEqual([
			['7', true],
			['7', true],
			['m7', false],
			['m7', false]
		]);
	});
});

describe('a lick taken out of an assigned deck, or the deck reordered', () => {
	test('retires the members’ still-new cards of that lick; one already introduced stays, and so do its reviews', async () => {
		const { teacher, deck, licks, learners } = await assignedDeck(['m7'], 2);
		const [first, second] = learners;
		// The first learner has already met the second lick over its home quality.
		const met = (await cardsOf(first.id, licks[1].id)).find((c) => c.quality === '7')!;
		await met.update({ state: 2, introducedDay: '2026-03-02', reps: 1 });
		await updateDeck(teacher, deck.id, { lickIds: [licks[0].id] }, LATER);
		for (const learner of [first, second]) {
			const cards = await cardsOf(learner.id, licks[1].id);
			for (const card of cards) {
				if (card.id === met.id) expect(card.retiredAt).toBeNull();
				else expect(card.retiredAt?.getTime()).toBe(LATER.getTime());
			}
			// The lick still in the deck is untouched.
			expect((await cardsOf(learner.id, licks[0].id)).every((c) => c.retiredAt === null)).toBe(
				true
			);
		}
	});

	test('a lick put back comes back to work at its new place', async () => {
		const { teacher, deck, licks, learners } = await assignedDeck(['m7'], 1);
		await updateDeck(teacher, deck.id, { lickIds: [licks[1].id] }, LATER);
		await updateDeck(teacher, deck.id, { lickIds: [licks[1].id, licks[0].id] }, LATER);
		const cards = await cardsOf(learners[0].id);
		expect(cards.map((c) => [c.lickId, c.quality, c.newPosition, c.retiredAt])).toEqual([
			[licks[1].id, '7', 0, null],
			[licks[1].id, 'm7', 1, null],
			[licks[0].id, '7', 16, null],
			[licks[0].id, 'm7', 17, null]
		]);
	});

	test('reordering moves the still-new cards with their licks, each quality in its slot; an introduced card keeps its place', async () => {
		const { teacher, deck, licks, learners } = await assignedDeck(['m7'], 1);
		const [learner] = learners;
		const met = (await cardsOf(learner.id, licks[0].id)).find((c) => c.quality === 'm7')!;
		await met.update({ state: 2, introducedDay: '2026-03-02', reps: 1 });
		const version = (await Card.findByPk(met.id))!.version;
		await updateDeck(teacher, deck.id, { lickIds: [licks[1].id, licks[0].id] }, LATER);
		const positions = Object.fromEntries(
			(await cardsOf(learner.id)).map((c) => [
				`${c.lickId === licks[0].id ? 'a' : 'b'}${c.quality}`,
				c.newPosition
			])
		);
		expect(positions).toEqual({ b7: 0, bm7: 1, a7: 16, am7: 1 });
		// Moving new cards is not a change a review could collide with.
		expect((await Card.findByPk(met.id))!.version).toBe(version);
	});
});
