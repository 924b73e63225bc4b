import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listAddable } from '../../../src/lib/server/study/addable';
import { POST as cardsPost } from '../../../src/routes/api/cards/+server';
import { openTestWorld, type TestWorld } from '../support/world';
import { call, makeClass, makeDeck, makeLick, makeUser } from './world';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
});
afterAll(() => world.close());

describe('listAddable', () => {
	it("lists a learner's own decks and licks, their teacher's class licks and public ones, with what is in the drill already", async () => {
		const learner = await makeUser('learner');
		const teacher = await makeUser('teacher');
		const stranger = await makeUser('teacher');
		const mine = await makeLick(learner, 'private', 'My own line');
		const other = await makeLick(learner, 'private', 'My second line');
		const shared = await makeLick(teacher, 'classes', 'Class line');
		const open = await makeLick(stranger, 'public', 'Open line');
		await makeLick(stranger, 'classes', 'Not my class');
		await makeLick(stranger, 'private', 'Hidden line');
		await makeClass(teacher, [learner]);
		const deck = await makeDeck(learner, [mine, other]);
		expect(
			(await call(cardsPost, learner, { method: 'POST', body: { lickId: mine.id } })).status
		).toBe(201);

		const addable = await listAddable({ id: learner.id });
		expect(addable.decks).toEqual([{ id: deck.id, name: deck.name, licks: 2, inDrill: 1 }]);
		expect(addable.licks.map((l) => [l.title, l.source, l.cards])).toEqual([
			['My own line', 'mine', 1],
			['My second line', 'mine', 0],
			['Class line', 'teacher', 0],
			['Open line', 'public', 0]
		]);
		expect(addable.licks.find((l) => l.id === open.id)).toMatchObject({
			homeKey: 'F',
			homeQuality: '7',
			authorName: stranger.name
		});
		expect(addable.licks.some((l) => l.id === shared.id)).toBe(true);
	});

	it('shows another learner nothing of the first one’s', async () => {
		const someone = await makeUser('learner');
		await makeLick(someone, 'private', 'Private to someone');
		await makeDeck(someone, []);
		const other = await makeUser('learner');
		const addable = await listAddable({ id: other.id });
		expect(addable.decks).toEqual([]);
		expect(addable.licks.map((l) => l.title)).not.toContain('Private to someone');
	});
});
