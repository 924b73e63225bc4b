import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn } from '../../../src/lib/server/auth/accounts';
import { Deck, DeckLick, Lick, User } from '../../../src/lib/server/db/models/index';
import { DEMO_DECKS, DEMO_LICKS } from '../../../src/lib/demo/licks';
import { DEMO_ACCOUNTS, seedDemo } from '../../../src/lib/server/demo/seed';
import { openTestWorld, type TestWorld } from '../support/world';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
});
afterAll(async () => {
	await world.close();
});

const snapshot = async () =>
	(await User.findAll({ order: [['email', 'ASC']], raw: true })).map((row) => ({ ...row }));

describe('seedDemo', () => {
	it('creates the five demo accounts with their roles, all verified', async () => {
		const report = await seedDemo('demo-password-12', new Date('2026-11-01T08:00:00Z'));
		// The demo class covers both decks, so the drill's own demo cards add nothing after it.
		expect(report.created.slice(0, -1)).toEqual([
			...DEMO_ACCOUNTS.map((account) => account.email),
			...DEMO_LICKS.map((lick) => `lick:${lick.slug}`),
			...DEMO_DECKS.map((deck) => `deck:${deck.slug}`)
		]);
		expect(report.created.at(-1)).toMatch(/^history:\d+ sittings, \d+ reviews$/);
		const rows = await snapshot();
		expect(rows.map((row) => [row.email, row.role])).toEqual([
			['admin@example.com', 'admin'],
			['alto@example.com', 'learner'],
			['guitar@example.com', 'learner'],
			['teacher@example.com', 'teacher'],
			['trumpet@example.com', 'learner']
		]);
		expect(rows.every((row) => row.emailVerifiedAt !== null)).toBe(true);
	});

	it('lets every demo account sign in with the demo password', async () => {
		for (const account of DEMO_ACCOUNTS) {
			const result = await signIn({ email: account.email, password: 'demo-password-12' });
			expect(result.ok, account.email).toBe(true);
		}
		expect((await signIn({ email: 'alto@example.com', password: 'wrong-password-1' })).ok).toBe(
			false
		);
	});

	it("refuses a weak demo password with the rule's own reason, writing nothing", async () => {
		const before = await snapshot();
		await expect(seedDemo('password12')).rejects.toThrow(
			/^DEMO_PASSWORD for admin@example\.com: Too easy to guess: it is one of the most common/
		);
		await expect(seedDemo('Twelvefold1')).rejects.toThrow(/the name of this site/);
		expect(await snapshot()).toEqual(before);
	});

	it('changes nothing when run a second time', async () => {
		const before = await snapshot();
		const report = await seedDemo('another-password-99');
		expect(report.created).toEqual([]);
		expect(report.kept).toHaveLength(DEMO_ACCOUNTS.length);
		expect(await snapshot()).toEqual(before);
	});
	it('gives the demo teacher the demo licks in the two demo decks, in order', async () => {
		await seedDemo('demo-password-12');
		const teacher = await User.findOne({ where: { email: 'teacher@example.com' } });
		const licks = await Lick.findAll({ where: { authorId: teacher!.id } });
		expect(licks.map((l) => l.title).sort()).toEqual(DEMO_LICKS.map((l) => l.title).sort());
		const decks = await Deck.findAll({ where: { ownerId: teacher!.id }, order: [['name', 'ASC']] });
		expect(decks.map((d) => d.name)).toEqual(DEMO_DECKS.map((d) => d.title).sort());
		const first = decks.find((d) => d.name === DEMO_DECKS[0].title)!;
		const placed = await DeckLick.findAll({
			where: { deckId: first.id },
			order: [['position', 'ASC']]
		});
		const titleOf = new Map(licks.map((l) => [l.id, l.title]));
		expect(placed.map((p) => titleOf.get(p.lickId))).toEqual(
			DEMO_LICKS.filter((l) => l.deck === DEMO_DECKS[0].slug).map((l) => l.title)
		);
	});
});
