import { randomUUID } from 'node:crypto';
import {
	Card,
	Deck,
	DeckLick,
	Lick,
	Review,
	User,
	type Role
} from '../../../src/lib/server/db/models/index';
import type { Actor } from '../../../src/lib/server/classes/common';
import type { SessionUser } from '../../../src/lib/server/auth/user';
import { normalizeSettings } from '../../../src/lib/practice/settings';
import { settingsOf, toSettingsColumns } from '../../../src/lib/server/study/settings';
import { fakeEvent, type FakeEventInput } from '../support/fake-event';

/**
 * People and decks for the class tests, made straight in the database (sign-up has its own
 * tests): each person comes back as the session user an endpoint would see.
 */

let counter = 0;

export async function makeUser(
	role: Role,
	name = role === 'teacher' ? 'Tess Marlow' : 'Lou Pardee',
	settings: Record<string, unknown> = {}
): Promise<SessionUser & Actor> {
	counter += 1;
	const row = await User.create({
		email: `${role}${counter}-${randomUUID().slice(0, 6)}@example.test`,
		name,
		role,
		passwordHash: 'not-a-real-hash',
		emailVerifiedAt: new Date(),
		...toSettingsColumns(normalizeSettings({ timezone: 'UTC', ...settings }))
	});
	return {
		id: row.id,
		email: row.email,
		name: row.name,
		role: row.role,
		emailVerified: true,
		settings: settingsOf(row)
	};
}

const abc = (title: string, key: string) =>
	['X:1', `T:${title}`, 'M:4/4', 'L:1/8', 'Q:1/4=120', `K:${key}`, '"C7"cBAG FEDC|'].join('\n');

/** A deck of `size` licks (home quality 7, tempo 120) owned by `ownerId`, in order. */
export async function makeDeck(ownerId: string, size = 4, name = 'Test deck', lickTitle = 'Lick') {
	const deck = await Deck.create({ ownerId, name });
	const licks: Lick[] = [];
	for (let i = 0; i < size; i++) {
		const lick = await Lick.create({
			authorId: ownerId,
			title: `${lickTitle} ${i + 1}`,
			abc: abc(`${lickTitle} ${i + 1}`, 'C'),
			homeKey: 'C',
			homeQuality: '7',
			tempo: 120
		});
		await DeckLick.create({ deckId: deck.id, lickId: lick.id, position: i });
		licks.push(lick);
	}
	return { deck, licks };
}

/** Introduce a card as the drill would (state 2, due at `due`, a tempo rung). */
export async function introduce(card: Card, day: string, due: Date, tempo: number | null = null) {
	await card.update({ state: 2, introducedDay: day, due, stability: 5, reps: 1, tempo });
}

let clientCounter = 0;

/** One review row as the drill stores it. */
export async function addReview(
	card: Card,
	at: Date,
	day: string,
	grade: number,
	key: string,
	extra: { tempo?: number; ms?: number } = {}
): Promise<void> {
	clientCounter += 1;
	await Review.create({
		cardId: card.id,
		userId: card.userId,
		lickId: card.lickId,
		clientId: `c${clientCounter}`,
		reviewedAt: at,
		day,
		grade,
		key,
		quality: card.quality,
		tempo: extra.tempo ?? 100,
		revealMs: extra.ms ?? 30_000,
		gradeMs: 0,
		stateBefore: '{}',
		stateAfter: '{}'
	});
}

type Handler = (event: never) => Response | Promise<Response>;

/** Call an endpoint as `user` (null: anonymous) with route params. */
export async function callAs(
	handler: Handler,
	user: SessionUser | null,
	params: Record<string, string>,
	input: FakeEventInput = {}
): Promise<Response> {
	const event = {
		...fakeEvent({ ...input, locals: { user, session: null } as App.Locals }),
		params
	};
	return handler(event as never);
}
