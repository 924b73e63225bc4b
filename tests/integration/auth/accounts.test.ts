import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { QueryTypes } from 'sequelize';
import {
	changePassword,
	deleteAccount,
	setRole,
	makeAdmin,
	requestPasswordReset,
	resendVerification,
	resetPassword,
	signIn,
	signUp,
	verifyEmail,
	TOKEN_LIFETIME_MS
} from '../../../src/lib/server/auth/accounts';
import { createSession, validateSessionToken } from '../../../src/lib/server/auth/session';
import { hashToken } from '../../../src/lib/server/auth/tokens';
import { EmailToken, Session, User } from '../../../src/lib/server/db/models/index';
import { listMessages } from '../../../src/lib/server/mail/outbox';
import { openTestWorld, tokenFromOutbox, type TestWorld } from '../support/world';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
});
afterAll(() => world.close());

const PASSWORD = 'walking-bass-7';
let counter = 0;
/** A fresh address per test, so tests do not depend on each other's accounts. */
function address(): string {
	counter += 1;
	return `player${counter}@example.test`;
}

async function signedUp(role: 'learner' | 'teacher' = 'learner') {
	const email = address();
	const result = await signUp({ email, password: PASSWORD, name: 'Pat Player', role });
	if (!result.ok) throw new Error(`sign-up failed: ${result.message}`);
	return { email, user: result.user };
}

describe('signing up', () => {
	test('creates an unverified account with a lower-cased address and mails a verification link', async () => {
		const result = await signUp({
			email: '  New.Player@Example.TEST ',
			password: PASSWORD,
			name: '  Nia   New ',
			role: 'teacher'
		});
		expect(result).toEqual({
			ok: true,
			mailSent: true,
			user: {
				id: expect.any(String),
				email: 'new.player@example.test',
				name: 'Nia New',
				role: 'teacher',
				emailVerified: false,
				settings: expect.objectContaining({ instrument: 'concert' })
			}
		});
		const mails = await listMessages();
		expect(mails.find((m) => m.to.includes('new.player@example.test'))?.subject).toBe(
			'Confirm your e-mail address for Twelvefold'
		);
		const token = await tokenFromOutbox('new.player@example.test', '/verify-email');
		// 32 random bytes in base64url without padding (RFC 4648 §5): 43 characters.
		expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
		// The table holds the hash of the link's token, not the token.
		expect(await EmailToken.findByPk(token)).toBeNull();
		expect(await EmailToken.findByPk(hashToken(token))).not.toBeNull();
	});

	test('refuses an address already taken, in any case', async () => {
		const { email } = await signedUp();
		const again = await signUp({
			email: email.toUpperCase(),
			password: PASSWORD,
			name: 'Twin',
			role: 'learner'
		});
		expect(again).toMatchObject({ ok: false, reason: 'email-taken', field: 'email' });
	});

	test.each([
		[{ name: 'A', email: 'not-an-address', password: PASSWORD, role: 'learner' }, 'email'],
		[{ name: 'A', email: 'a@b', password: PASSWORD, role: 'learner' }, 'email'],
		[{ name: 'A', email: 42, password: PASSWORD, role: 'learner' }, 'email'],
		[{ name: 'A', email: 'a@example.test', password: 'short', role: 'learner' }, 'password'],
		[{ name: 'A', email: 'a@example.test', password: ['x'], role: 'learner' }, 'password'],
		[{ name: 'A', email: 'a@example.test', password: PASSWORD, role: 'admin' }, 'role'],
		[{ name: 'A', email: 'a@example.test', password: PASSWORD, role: 7 }, 'role'],
		[{ name: '   ', email: 'a@example.test', password: PASSWORD, role: 'learner' }, 'name'],
		[{ name: 'x'.repeat(101), email: 'a@example.test', password: PASSWORD }, 'name'],
		[{ email: 'a@example.test', password: PASSWORD }, 'name'],
		[{}, 'name']
	])('refuses %j naming the field %s, and creates nothing', async (input, field) => {
		const before = await User.count();
		const result = await signUp(input);
		expect(result).toMatchObject({ ok: false, reason: 'invalid', field });
		expect(await User.count()).toBe(before);
	});

	test('two sign-ups for one address at the same time create one account', async () => {
		const email = address();
		const results = await Promise.all(
			[1, 2, 3].map(() => signUp({ email, password: PASSWORD, name: 'Racer', role: 'learner' }))
		);
		expect(results.filter((r) => r.ok)).toHaveLength(1);
		expect(await User.count({ where: { email } })).toBe(1);
	});
});

describe('verifying the address', () => {
	test('the mailed link confirms the address once; opening it again still says confirmed', async () => {
		const { email, user } = await signedUp();
		const token = await tokenFromOutbox(email, '/verify-email');
		expect(await verifyEmail(token)).toEqual({ ok: true, userId: user.id, already: false });
		expect((await User.findByPk(user.id))!.emailVerifiedAt).toBeInstanceOf(Date);
		expect(await verifyEmail(token)).toEqual({ ok: true, userId: user.id, already: true });
	});

	test('an expired link is refused and the address stays unconfirmed', async () => {
		const { email, user } = await signedUp();
		const token = await tokenFromOutbox(email, '/verify-email');
		const later = new Date(Date.now() + TOKEN_LIFETIME_MS.verify + 1000);
		expect(await verifyEmail(token, later)).toEqual({
			ok: false,
			reason: 'bad-token',
			message: 'This link has expired.'
		});
		expect((await User.findByPk(user.id))!.emailVerifiedAt).toBeNull();
	});

	test('asking for a new link voids the old one', async () => {
		const { email, user } = await signedUp();
		const first = await tokenFromOutbox(email, '/verify-email');
		await new Promise((r) => setTimeout(r, 5)); // outbox names sort by arrival time
		expect(await resendVerification(user.id)).toEqual({ ok: true, mailSent: true });
		const second = await tokenFromOutbox(email, '/verify-email');
		expect(second).not.toBe(first);
		expect(await verifyEmail(first)).toMatchObject({ ok: false, reason: 'bad-token' });
		expect(await verifyEmail(second)).toMatchObject({ ok: true, already: false });
		expect(await resendVerification(user.id)).toEqual({ ok: false, reason: 'already-verified' });
	});

	test.each([undefined, null, 42, '', 'short', 'x'.repeat(43), 'x'.repeat(500)])(
		'a malformed or unknown token %# is refused without throwing',
		async (token) => {
			expect(await verifyEmail(token)).toMatchObject({ ok: false, reason: 'bad-token' });
		}
	);
});

describe('signing in', () => {
	test('the right password signs in, in any case of the address', async () => {
		const { email, user } = await signedUp();
		expect(await signIn({ email: email.toUpperCase(), password: PASSWORD })).toEqual({
			ok: true,
			user
		});
	});

	test('a wrong password and an unknown address get the same answer', async () => {
		const { email } = await signedUp();
		const wrong = await signIn({ email, password: 'walking-bass-8' });
		const unknown = await signIn({ email: 'nobody@example.test', password: PASSWORD });
		expect(wrong).toEqual(unknown);
		expect(wrong).toEqual({
			ok: false,
			reason: 'wrong-credentials',
			message: 'That e-mail and password do not match an account.'
		});
	});

	test.each([
		[{}, 'email'],
		[{ email: 'x@example.test' }, 'password'],
		[{ email: ['x@example.test'], password: PASSWORD }, 'email'],
		[{ email: 'x@example.test', password: 12345 }, 'password']
	])('refuses malformed input %j naming %s', async (input, field) => {
		expect(await signIn(input)).toMatchObject({ ok: false, reason: 'invalid', field });
	});
});

describe('resetting a forgotten password', () => {
	test('the mailed link sets a new password once, ends every session and confirms the address', async () => {
		const { email, user } = await signedUp();
		const { token: sessionToken } = await createSession(user.id);
		expect(await requestPasswordReset(email.toUpperCase())).toEqual({ ok: true });
		const token = await tokenFromOutbox(email, '/reset-password');

		expect(await resetPassword(token, 'short')).toMatchObject({ reason: 'invalid' });
		expect(await resetPassword(token, 'comping-chords-9')).toEqual({ ok: true, userId: user.id });
		expect(await signIn({ email, password: PASSWORD })).toMatchObject({ ok: false });
		expect(await signIn({ email, password: 'comping-chords-9' })).toMatchObject({ ok: true });
		expect((await validateSessionToken(sessionToken)).user).toBeNull();
		expect((await User.findByPk(user.id))!.emailVerifiedAt).toBeInstanceOf(Date);

		expect(await resetPassword(token, 'another-one-10')).toMatchObject({
			ok: false,
			reason: 'bad-token'
		});
	});

	test('a reset link lasts one hour', async () => {
		const { email } = await signedUp();
		await requestPasswordReset(email);
		const token = await tokenFromOutbox(email, '/reset-password');
		const later = new Date(Date.now() + 61 * 60 * 1000);
		expect(await resetPassword(token, 'comping-chords-9', later)).toEqual({
			ok: false,
			reason: 'bad-token',
			message: 'This link has expired.'
		});
	});

	test('an unknown address gets the same answer and no mail', async () => {
		const before = (await listMessages()).length;
		expect(await requestPasswordReset('nobody-here@example.test')).toEqual({ ok: true });
		expect((await listMessages()).length).toBe(before);
	});

	test('a verification token does not work as a reset token', async () => {
		const { email } = await signedUp();
		const token = await tokenFromOutbox(email, '/verify-email');
		expect(await resetPassword(token, 'comping-chords-9')).toMatchObject({ reason: 'bad-token' });
	});
});

describe('changing the password', () => {
	test('needs the current password, keeps this session and ends the others', async () => {
		const { email, user } = await signedUp();
		const here = await createSession(user.id);
		const elsewhere = await createSession(user.id);

		expect(
			await changePassword(user.id, {
				currentPassword: 'wrong-password-1',
				password: 'comping-chords-9'
			})
		).toMatchObject({
			ok: false,
			field: 'currentPassword'
		});
		expect(
			await changePassword(user.id, { currentPassword: PASSWORD, password: 'abc' })
		).toMatchObject({ field: 'password' });
		expect(
			await changePassword(user.id, { currentPassword: PASSWORD, password: PASSWORD })
		).toMatchObject({ field: 'password' });
		expect(
			await changePassword(
				user.id,
				{ currentPassword: PASSWORD, password: 'comping-chords-9', confirm: 'comping-chords-9' },
				here.session.id
			)
		).toEqual({
			ok: true
		});

		expect((await validateSessionToken(here.token)).user?.id).toBe(user.id);
		expect((await validateSessionToken(elsewhere.token)).user).toBeNull();
		expect(await signIn({ email, password: 'comping-chords-9' })).toMatchObject({ ok: true });
	});
});

describe('deleting an account', () => {
	test('needs the password, then removes the user with their sessions and tokens', async () => {
		const { user } = await signedUp();
		await createSession(user.id);
		expect(
			await deleteAccount(user, { confirmEmail: user.email, deletePassword: 'not-my-password' })
		).toMatchObject({ ok: false, field: 'deletePassword' });
		expect(
			await deleteAccount(user, { confirmEmail: 'someone@else.test', deletePassword: PASSWORD })
		).toMatchObject({
			ok: false,
			field: 'confirmEmail',
			message: 'Type your e-mail address exactly to confirm; nothing was deleted.'
		});
		expect(await User.findByPk(user.id)).not.toBeNull();

		expect(
			await deleteAccount(user, {
				confirmEmail: ` ${user.email.toUpperCase()} `,
				deletePassword: PASSWORD
			})
		).toEqual({ ok: true });
		expect(await User.findByPk(user.id)).toBeNull();
		const left = await world.db.query<{ n: number }>(
			'SELECT (SELECT COUNT(*) FROM sessions WHERE user_id = :id) + (SELECT COUNT(*) FROM email_tokens WHERE user_id = :id) AS n',
			{ type: QueryTypes.SELECT, replacements: { id: user.id } }
		);
		expect(left[0].n).toBe(0);
		expect(
			await deleteAccount(user, { confirmEmail: user.email, deletePassword: PASSWORD })
		).toMatchObject({ reason: 'not-found' });
	});
});

describe('roles', () => {
	test('makeAdmin makes an admin once and reports when nothing changed', async () => {
		const { email, user } = await signedUp();
		expect(await makeAdmin(email)).toMatchObject({
			ok: true,
			changed: true,
			user: { id: user.id, role: 'admin' }
		});
		expect(await makeAdmin(email)).toMatchObject({ ok: true, changed: false });
		expect((await User.findByPk(user.id))!.role).toBe('admin');
	});

	test.each([
		['nobody@example.test', 'admin', 'not-found'],
		['not an address', 'admin', 'invalid'],
		['x@example.test', 'superuser', 'invalid']
	])('setRole(%j, %j) answers %s', async (email, role, reason) => {
		expect(await setRole(null, { email, role })).toMatchObject({ ok: false, reason });
	});

	test('an admin cannot change their own role, and can demote another account', async () => {
		const { email } = await signedUp();
		expect(await setRole({ email }, { email, role: 'learner' })).toEqual({
			ok: false,
			reason: 'own-role',
			message: 'You cannot change your own role; ask another admin.'
		});
		const other = await signedUp();
		await makeAdmin(other.email);
		expect(await setRole({ email }, { email: other.email, role: 'learner' })).toMatchObject({
			ok: true,
			changed: true,
			user: { role: 'learner' }
		});
	});

	test('a session sees a new role on its next request', async () => {
		const { email, user } = await signedUp();
		const { token } = await createSession(user.id);
		await setRole(null, { email, role: 'teacher' });
		expect((await validateSessionToken(token)).user?.role).toBe('teacher');
		expect(await Session.count({ where: { userId: user.id } })).toBe(1);
	});
});
