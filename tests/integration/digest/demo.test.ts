import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openTestWorld, type TestWorld } from '../support/world';
import { seedDemo } from '../../../src/lib/server/demo/seed';
import { runScheduledMail } from '../../../src/lib/server/digest/send';
import { readOutbox, recipientsOf } from './fixtures';
import { User } from '../../../src/lib/server/db/models/index';
import { todayCounts } from '../../../src/lib/server/study/today';

/**
 * `npm run digest` on the demo school: its three learners have practice history and licks due,
 * so each gets one Daily reminder; the admin and the teacher (no licks of their own) get none;
 * a second run the same day puts nothing more in the outbox.
 */
let world: TestWorld;
const seededAt = new Date('2026-03-04T12:00:00Z');

beforeAll(async () => {
	world = await openTestWorld();
	await seedDemo('demo-password-12', seededAt);
});
afterAll(() => world.close());

describe('the scheduled mails on the demo data', () => {
	it('put one reminder per demo learner in the outbox, and a second run none', async () => {
		// The evening after seeding, 20:00 UTC: every demo person's hour has come (Berlin 21:00,
		// Lisbon 20:00, New York 15:00). Eligible: the drill's queue holds something for them.
		const at = new Date('2026-03-05T20:00:00Z');
		const eligible: string[] = [];
		for (const email of ['alto@example.com', 'guitar@example.com', 'trumpet@example.com']) {
			const user = await User.findOne({ where: { email } });
			const today = await todayCounts(user!.id, at);
			if (today.due + today.new > 0) eligible.push(email);
		}
		expect(eligible).toHaveLength(3);
		const first = await runScheduledMail({ now: at, log: () => {} });
		expect(first).toMatchObject({ sent: 3, failed: 0 });
		const mails = await readOutbox(world.dataDir);
		expect(mails.flatMap(recipientsOf).sort()).toEqual([
			'alto@example.com',
			'guitar@example.com',
			'trumpet@example.com'
		]);
		for (const mail of mails)
			expect(mail.subject).toMatch(/^Today: \d+ licks?, about \d+ minutes?$/);

		const second = await runScheduledMail({ now: new Date('2026-03-05T21:30:00Z'), log: () => {} });
		expect(second).toMatchObject({ sent: 0, failed: 0 });
		expect(await readOutbox(world.dataDir)).toHaveLength(3);
	});
});
