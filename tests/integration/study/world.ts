/**
 * Helpers for the drill's integration tests: people, licks, decks and classes made straight in a
 * real SQLite file (the world of `openTestWorld`), and route handlers called as plain functions
 * with a signed-in user in `locals`.
 */
import { normalizeSettings, type UserSettings } from '../../../src/lib/practice/settings';
import type { SessionUser } from '../../../src/lib/server/auth/user';
import { toSettingsColumns } from '../../../src/lib/server/study/settings';
import {
	ClassGroup,
	ClassMember,
	Deck,
	DeckLick,
	Lick,
	User,
	type Role,
	type Visibility
} from '../../../src/lib/server/db/models/index';
import { fakeEvent, type FakeEventInput } from '../support/fake-event';

let serial = 0;

export async function makeUser(
	role: Role = 'learner',
	settings: Partial<UserSettings> = {}
): Promise<SessionUser> {
	serial++;
	const row = await User.create({
		email: `study${serial}-${Math.random().toString(36).slice(2, 8)}@example.test`,
		name: `Person ${serial}`,
		role,
		passwordHash: 'not-a-real-hash',
		emailVerifiedAt: new Date(),
		...toSettingsColumns(normalizeSettings(settings))
	});
	return {
		id: row.id,
		email: row.email,
		name: row.name,
		role,
		emailVerified: true,
		settings: normalizeSettings(settings)
	};
}

/** A dominant lick in F (our own line, written for these tests). */
export const TEST_ABC = 'X:1\nT:Test line\nM:4/4\nL:1/8\nQ:1/4=140\nK:F\n"F7"A G F E _E D C A,|';

export async function makeLick(
	author: SessionUser,
	visibility: Visibility = 'private',
	title = 'Test line'
): Promise<Lick> {
	return Lick.create({
		authorId: author.id,
		title,
		abc: TEST_ABC.replace('Test line', title),
		homeKey: 'F',
		homeQuality: '7',
		tempo: 140,
		visibility
	});
}

export async function makeDeck(owner: SessionUser, licks: Lick[]): Promise<Deck> {
	const deck = await Deck.create({ ownerId: owner.id, name: `Deck ${++serial}` });
	await DeckLick.bulkCreate(
		licks.map((l, position) => ({ deckId: deck.id, lickId: l.id, position }))
	);
	return deck;
}

export async function makeClass(teacher: SessionUser, members: SessionUser[]): Promise<ClassGroup> {
	const group = await ClassGroup.create({ teacherId: teacher.id, name: `Class ${++serial}` });
	await ClassMember.bulkCreate(
		members.map((m) => ({ classId: group.id, userId: m.id, joinedAt: new Date() }))
	);
	return group;
}

type Handler = (event: never) => Response | Promise<Response>;

/** Call a route handler as `user` (null: no session) and read its JSON answer. */
export async function call(
	handler: Handler,
	user: SessionUser | null,
	input: FakeEventInput & { params?: Record<string, string> } = {}
): Promise<{ status: number; body: Record<string, unknown> & { error?: { message: string } } }> {
	const event = {
		...fakeEvent({ ...input, locals: { user, session: null } }),
		params: input.params ?? {}
	};
	const response = await handler(event as never);
	const text = await response.text();
	return { status: response.status, body: text ? JSON.parse(text) : {} };
}
