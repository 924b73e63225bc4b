import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { ClassGroup, Comment, Review, User } from '../../../src/lib/server/db/models/index';
import { listAssignments } from '../../../src/lib/server/classes/assignments';
import { classProgress } from '../../../src/lib/server/classes/progress';
import { learnerDetail } from '../../../src/lib/server/classes/learner';
import { DEMO_CLASS_NAME, HISTORY_DAYS } from '../../../src/lib/server/demo/history';
import { seedDemo } from '../../../src/lib/server/demo/seed';
import { openTestWorld, type TestWorld } from '../support/world';

let world: TestWorld;
const NOW = new Date('2026-11-20T12:00:00Z');
beforeAll(async () => {
	world = await openTestWorld();
	await seedDemo('demo-password-12', NOW);
}, 180_000);
afterAll(() => world.close());

async function teacherAndClass() {
	const teacher = (await User.findOne({ where: { email: 'teacher@example.com' } }))!;
	const cls = (await ClassGroup.findOne({ where: { name: DEMO_CLASS_NAME } }))!;
	return { teacher: { id: teacher.id, role: teacher.role }, cls };
}

describe('the demo history', () => {
	test('one class with the three demo learners and the two demo decks assigned', async () => {
		const { teacher, cls } = await teacherAndClass();
		const assignments = await listAssignments(teacher, cls.id);
		expect(
			assignments.ok && assignments.items.map((a) => [a.deckName, a.newPerDay, a.qualities])
		).toEqual([
			['First steps over the dominant', 2, []],
			['Colours and leaps', 1, ['m7']]
		]);
		const progress = await classProgress(teacher, cls.id, { sort: 'name' }, NOW);
		expect(progress.ok && progress.items.map((r) => r.name)).toEqual([
			'Ines Kowal',
			'Sam Adeyemi',
			'Theo Marsh'
		]);
	});

	test('every learner has practised through the real drill, and the habits show in the figures', async () => {
		const { teacher, cls } = await teacherAndClass();
		const progress = await classProgress(teacher, cls.id, { sort: 'name' }, NOW);
		if (!progress.ok) throw new Error(progress.message);
		const [ines, sam] = progress.items;
		for (const row of progress.items) expect(row.lastPracticeAt, row.name).not.toBeNull();
		// Steady Theo practises more days than Sam, who comes in bursts.
		const days = async (email: string) => {
			const user = (await User.findOne({ where: { email } }))!;
			return new Set((await Review.findAll({ where: { userId: user.id } })).map((r) => r.day)).size;
		};
		expect(await days('guitar@example.com')).toBeGreaterThan(await days('trumpet@example.com'));
		expect(await days('guitar@example.com')).toBeLessThanOrEqual(HISTORY_DAYS);
		// Ines fumbles the keys with many sharps.
		expect(ines.weakestKeys.length).toBeGreaterThan(0);
		// Her weakest key is one of them; a chance slip elsewhere may follow it.
		expect(['E', 'B', 'Gb', 'A']).toContain(ines.weakestKeys[0]);
		const map = await learnerDetail(teacher, cls.id, sam.userId);
		if (!map.ok) throw new Error(map.message);
		// Sam drills around the cycle of fourths: his columns follow it.
		expect(map.view.keys.slice(0, 3)).toEqual(['C', 'F', 'Bb']);
		expect(map.view.rows.some((r) => r.cells.some((c) => c.reviews > 0))).toBe(true);
	});

	test('a few comment threads, and seeding again adds nothing', async () => {
		expect(await Comment.count()).toBeGreaterThanOrEqual(2);
		const reviews = await Review.count();
		const again = await seedDemo('demo-password-12', NOW);
		expect(again.created).toEqual([]);
		expect(await Review.count()).toBe(reviews);
	});
});
