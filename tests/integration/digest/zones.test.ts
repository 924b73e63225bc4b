import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openTestWorld, type TestWorld } from '../support/world';
import { runScheduledMail } from '../../../src/lib/server/digest/send';
import { MailSend, User } from '../../../src/lib/server/db/models/index';
import { makeCard, makeLick, makeUser, readOutbox, recipientsOf } from './fixtures';

/**
 * The reminder goes out once the person's local hour has come on their practice day, whatever
 * their offset from UTC and across summer-time changes. Offsets: Pacific/Honolulu is UTC−10 all
 * year, Pacific/Tongatapu UTC+13 (IANA tz database); America/New_York springs forward at 02:00 on
 * 8 March 2026 and Europe/Berlin falls back at 03:00 on 25 October 2026 (EU and US summer-time
 * rules, from memory; the runtime's own tz data decides).
 */

interface Case {
	title: string;
	zone: string;
	digestHour: number;
	dayStartHour: number;
	/** Each run's instant, and the practice day of the mail it sends (null: none). */
	runs: [string, string | null][];
}

const cases: Case[] = [
	{
		title: 'at UTC−10 the reminder of 2 March goes at 07:00 Honolulu time, 17:00 UTC',
		zone: 'Pacific/Honolulu',
		digestHour: 7,
		dayStartHour: 4,
		runs: [
			['2026-03-02T16:59:00Z', null],
			['2026-03-02T17:00:00Z', '2026-03-02'],
			// 23:00 the same evening, then 04:00 and 06:00 the next morning: still the same mail.
			['2026-03-03T09:00:00Z', null],
			['2026-03-03T14:00:00Z', null],
			['2026-03-03T16:00:00Z', null],
			['2026-03-03T17:05:00Z', '2026-03-03']
		]
	},
	{
		title: 'at UTC+13 the reminder of 2 March goes on 1 March, 18:00 UTC',
		zone: 'Pacific/Tongatapu',
		digestHour: 7,
		dayStartHour: 4,
		runs: [
			['2026-03-01T17:55:00Z', null],
			['2026-03-01T18:00:00Z', '2026-03-02'],
			['2026-03-02T10:00:00Z', null],
			['2026-03-02T18:00:00Z', '2026-03-03']
		]
	},
	{
		title: 'when New York springs forward, 07:00 comes an hour earlier in UTC',
		zone: 'America/New_York',
		digestHour: 7,
		dayStartHour: 4,
		runs: [
			['2026-03-07T11:30:00Z', null],
			['2026-03-07T12:00:00Z', '2026-03-07'],
			['2026-03-08T10:59:00Z', null],
			['2026-03-08T11:00:00Z', '2026-03-08']
		]
	},
	{
		title: 'a 02:00 reminder on the night 02:00 is skipped goes at 03:00, for the day before',
		zone: 'America/New_York',
		digestHour: 2,
		dayStartHour: 4,
		runs: [
			['2026-03-08T06:59:00Z', null],
			['2026-03-08T07:00:00Z', '2026-03-07']
		]
	},
	{
		title: 'a 02:00 reminder on the night Berlin lives 02:00 twice goes once',
		zone: 'Europe/Berlin',
		digestHour: 2,
		dayStartHour: 4,
		runs: [
			['2026-10-24T23:59:00Z', null],
			['2026-10-25T00:00:00Z', '2026-10-24'],
			['2026-10-25T01:00:00Z', null],
			['2026-10-25T01:30:00Z', null]
		]
	}
];

let world: TestWorld;
let lickId: string;

beforeAll(async () => {
	world = await openTestWorld();
	const author = await makeUser({ email: 'author@example.com', digestEnabled: false });
	lickId = (await makeLick(author.id, 'Any lick')).id;
});
afterAll(() => world.close());

describe('the reminder’s local day', () => {
	it.each(cases.map((c, i) => [c.title, c, i] as const))('%s', async (_title, c, i) => {
		// Only this case's person is switched on, so the runs of other cases cannot reach them.
		await User.update({ digestEnabled: false }, { where: {} });
		const email = `zone${i}@example.com`;
		const who = await makeUser({
			email,
			timezone: c.zone,
			digestHour: c.digestHour,
			dayStartHour: c.dayStartHour
		});
		// Long overdue, so that every day has something due.
		await makeCard(who.id, lickId, { state: 2, due: new Date('2025-01-01T00:00:00Z') });
		const seen: (string | null)[] = [];
		for (const [instant] of c.runs) {
			const before = await MailSend.count({ where: { userId: who.id, status: 'sent' } });
			await runScheduledMail({ now: new Date(instant), kinds: ['digest'], log: () => {} });
			const rows = await MailSend.findAll({
				where: { userId: who.id, status: 'sent' },
				order: [['day', 'ASC']]
			});
			seen.push(rows.length > before ? rows[rows.length - 1].day : null);
		}
		expect(seen).toEqual(c.runs.map(([, day]) => day));
		const delivered = (await readOutbox(world.dataDir)).filter((m) =>
			recipientsOf(m).includes(email)
		);
		expect(delivered).toHaveLength(c.runs.filter(([, day]) => day).length);
	});
});
