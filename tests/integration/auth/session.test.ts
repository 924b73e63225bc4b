import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { QueryTypes } from 'sequelize';
import {
	createSession,
	createSessionAdapter,
	invalidateSession,
	invalidateUserSessions,
	validateSessionToken
} from '../../../src/lib/server/auth/session';
import { hashToken } from '../../../src/lib/server/auth/tokens';
import { Session, User } from '../../../src/lib/server/db/models/index';
import { openTestWorld, type TestWorld } from '../support/world';

let world: TestWorld;
let userId: string;
beforeAll(async () => {
	world = await openTestWorld();
	const user = await User.create({
		email: 'sess@example.test',
		name: 'Sess',
		passwordHash: 'unused',
		role: 'teacher'
	});
	userId = user.id;
});
afterAll(() => world.close());

const DAY = 24 * 60 * 60 * 1000;

describe('sessions', () => {
	test('the table stores the SHA-256 of the token, never the token itself', async () => {
		const { token, session } = await createSession(userId);
		const rows = await world.db.query<{ id: string; user_id: string }>(
			'SELECT id, user_id FROM sessions',
			{ type: QueryTypes.SELECT }
		);
		const ids = rows.map((row) => row.id);
		expect(ids).toContain(hashToken(token));
		expect(ids).not.toContain(token);
		expect(session.id).toBe(hashToken(token));
		// A SHA-256 digest in hex (FIPS 180-4): 64 characters.
		expect(session.id).toMatch(/^[0-9a-f]{64}$/);
	});

	test('a token validates to its user and session; the stored id does not work as a token', async () => {
		const { token } = await createSession(userId);
		const valid = await validateSessionToken(token);
		expect(valid.user).toEqual({
			id: userId,
			email: 'sess@example.test',
			name: 'Sess',
			role: 'teacher',
			emailVerified: false,
			settings: expect.objectContaining({ timezone: 'UTC', desiredRetention: 0.9 })
		});
		expect(valid.session?.id).toBe(hashToken(token));
		expect(valid.session?.fresh).toBe(false);
		// Someone holding a copy of the table holds only hashes; hashing one again finds nothing.
		expect(await validateSessionToken(hashToken(token))).toEqual({ user: null, session: null });
	});

	test.each(['', 'garbage', 'x'.repeat(5000)])(
		'a made-up token %# finds nothing',
		async (token) => {
			expect(await validateSessionToken(token)).toEqual({ user: null, session: null });
		}
	);

	test('an expired session is refused and removed', async () => {
		const { token, session } = await createSession(userId);
		await Session.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { id: session.id } });
		expect(await validateSessionToken(token)).toEqual({ user: null, session: null });
		expect(await Session.findByPk(session.id)).toBeNull();
	});

	test('a session in the second half of its life is extended and marked fresh', async () => {
		const { token, session } = await createSession(userId);
		const soon = new Date(Date.now() + 5 * DAY);
		await Session.update({ expiresAt: soon }, { where: { id: session.id } });
		const valid = await validateSessionToken(token);
		expect(valid.session?.fresh).toBe(true);
		expect(valid.session!.expiresAt.getTime()).toBeGreaterThan(Date.now() + 29 * DAY);
		const row = await Session.findByPk(session.id);
		expect(row!.expiresAt.getTime()).toBe(valid.session!.expiresAt.getTime());
	});

	test('invalidating one session leaves the others; invalidating the user ends all', async () => {
		const a = await createSession(userId);
		const b = await createSession(userId);
		await invalidateSession(a.session.id);
		expect((await validateSessionToken(a.token)).user).toBeNull();
		expect((await validateSessionToken(b.token)).user?.id).toBe(userId);
		await invalidateUserSessions(userId);
		expect((await validateSessionToken(b.token)).user).toBeNull();
		expect(await Session.count({ where: { userId } })).toBe(0);
	});

	test('the adapter hashes on every method that takes a raw session id', async () => {
		const adapter = createSessionAdapter();
		const expiresAt = new Date(Date.now() + DAY);
		await adapter.setSession({ id: 'raw-token-1', userId, expiresAt, attributes: {} });
		expect(await Session.findByPk('raw-token-1')).toBeNull();
		expect(await Session.findByPk(hashToken('raw-token-1'))).not.toBeNull();

		const [session, user] = await adapter.getSessionAndUser('raw-token-1');
		expect(session).toEqual({ id: 'raw-token-1', userId, expiresAt, attributes: {} });
		expect(user?.id).toBe(userId);
		expect(user?.attributes).toMatchObject({ email: 'sess@example.test', role: 'teacher' });

		const later = new Date(Date.now() + 2 * DAY);
		await adapter.updateSessionExpiration('raw-token-1', later);
		expect((await Session.findByPk(hashToken('raw-token-1')))!.expiresAt).toEqual(later);

		expect((await adapter.getUserSessions(userId)).map((s) => s.id)).toEqual([
			hashToken('raw-token-1')
		]);

		await adapter.setSession({ id: 'old', userId, expiresAt: new Date(1000), attributes: {} });
		await adapter.deleteExpiredSessions();
		expect(await Session.count({ where: { userId } })).toBe(1);

		await adapter.deleteSession('raw-token-1');
		expect(await adapter.getSessionAndUser('raw-token-1')).toEqual([null, null]);
		await adapter.setSession({ id: 'again', userId, expiresAt, attributes: {} });
		await adapter.deleteUserSessions(userId);
		expect(await Session.count({ where: { userId } })).toBe(0);
	});
});
