import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../../../src/lib/server/db/models/index';
import { seedDemo } from '../../../src/lib/server/demo/seed';
import { seedDemoPractice } from '../../../src/lib/server/demo/practice';
import { buildToday } from '../../../src/lib/server/study/today';
import { configureEngineBudget } from '../../../src/lib/server/music/render';
import { openTestWorld, type TestWorld } from '../support/world';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
	// The engine's global budget guards production; these tests are about the drill.
	configureEngineBudget(60_000);
	await seedDemo('demo-password-12');
});
afterAll(() => world.close());

describe('demo practice', () => {
	it.each([
		['guitar@example.com', 'guitar'],
		['alto@example.com', 'alto-sax'],
		['trumpet@example.com', 'trumpet']
	])(
		'gives %s prompts for today right after seeding, written for the %s',
		async (email, instrument) => {
			const user = (await User.findOne({ where: { email } }))!;
			const today = await buildToday({ id: user.id }, new Date());
			expect(
				today.items.length,
				JSON.stringify([today.day, today.counts, today.backlog])
			).toBeGreaterThan(0);
			expect(today.items.every((i) => i.instrument === instrument)).toBe(true);
			// The demo class's second deck is still arriving (one a day): new licks wait today.
			expect(today.counts.new).toBeGreaterThan(0);
		}
	);

	it('adds nothing when seeded again', async () => {
		const again = await seedDemoPractice('teacher@example.com', [
			'guitar@example.com',
			'alto@example.com'
		]);
		expect(again.map((r) => r.created)).toEqual([0, 0]);
	});
});
