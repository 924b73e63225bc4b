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
import { listMessages, readMessage } from '../../../src/lib/server/mail/outbox';
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
		expect(await resetPassword(token, 'comping-chords-9')).toEqual({
			ok: true,
			userId: user.id,
			mailSent: true
		});
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
		).toEqual({ ok: true, mailSent: true });

		expect((await validateSessionToken(here.token)).user?.id).toBe(user.id);
		expect((await validateSessionToken(elsewhere.token)).user).toBeNull();
		expect(await signIn({ email, password: 'comping-chords-9' })).toMatchObject({ ok: true });
	});
});

describe('weak passwords', () => {
	test.each(['password12', 'qwerty1234', 'Twelvefold1', 'EMAIL'])(
		'%j is refused at sign-up, by a reset link and on a password change, changing nothing',
		async (weak) => {
			const email = address();
			const password = weak === 'EMAIL' ? email : weak;
			const before = await User.count();
			expect(await signUp({ email, password, name: 'Wes Weak', role: 'learner' })).toMatchObject({
				ok: false,
				field: 'password',
				message: expect.stringMatching(/^Too easy to guess: .+ Use at least 10 characters/)
			});
			expect(await User.count()).toBe(before);

			const { email: owner, user } = await signedUp();
			const own = weak === 'EMAIL' ? owner : weak;
			const hashBefore = (await User.findByPk(user.id))!.passwordHash;
			expect(
				await changePassword(user.id, { currentPassword: PASSWORD, password: own, confirm: own })
			).toMatchObject({ ok: false, field: 'password' });
			await requestPasswordReset(owner);
			const token = await tokenFromOutbox(owner, '/reset-password');
			expect(await resetPassword(token, own)).toMatchObject({ ok: false, field: 'password' });
			expect((await User.findByPk(user.id))!.passwordHash).toBe(hashBefore);
			// The link was not spent on the refusal: a good password still goes through with it.
			expect(await resetPassword(token, 'comping-chords-9')).toMatchObject({ ok: true });
		}
	);

	test("a password built on the owner's name is refused with that reason", async () => {
		const result = await signUp({
			email: address(),
			password: 'Marguerite Oduya 1',
			name: 'Marguerite Oduya',
			role: 'learner'
		});
		expect(result).toMatchObject({
			field: 'password',
			message: expect.stringMatching(/your name/)
		});
	});
});

describe('concurrent password changes', () => {
	test('twenty at once from the same current password: exactly one takes effect, the others are refused', async () => {
		const { email, user } = await signedUp();
		const candidates = Array.from({ length: 20 }, (_, i) => `parallel-change-${i}-x7`);
		const results = await Promise.all(
			candidates.map((password) =>
				changePassword(user.id, { currentPassword: PASSWORD, password, confirm: password })
			)
		);
		const winners = results.flatMap((r, i) => (r.ok ? [candidates[i]] : []));
		expect(winners).toHaveLength(1);
		for (const result of results.filter((r) => !r.ok)) {
			// Either the compare-and-set lost, or (started after the winner wrote) the current
			// password no longer matched: both a clear refusal, never a silent success.
			expect(result).toMatchObject(
				expect.objectContaining({
					ok: false,
					message: expect.stringMatching(
						/changed by another request at the same moment|not your current password/
					)
				})
			);
		}
		expect(results.filter((r) => !r.ok && r.reason === 'conflict').length).toBeGreaterThan(0);
		expect(await signIn({ email, password: winners[0] })).toMatchObject({ ok: true });
		expect(await signIn({ email, password: PASSWORD })).toMatchObject({ ok: false });
		// One change, one mail to the owner.
		const changedMails = (await listMessages()).filter(
			(m) => m.to.includes(email) && m.subject === 'Your Twelvefold password was changed'
		);
		expect(changedMails).toHaveLength(1);
	});
});

describe('mails to the owner when the password changes', () => {
	test('a change and a reset each mail the owner, saying what to do if it was not them', async () => {
		const { email, user } = await signedUp();
		await changePassword(user.id, {
			currentPassword: PASSWORD,
			password: 'comping-chords-9',
			confirm: 'comping-chords-9'
		});
		const changed = await newestMailTo(email);
		expect(changed.subject).toBe('Your Twelvefold password was changed');
		expect(changed.text).toMatch(/If it was not you, someone knows your password/);
		expect(changed.links).toEqual(['http://twelvefold.test/forgot-password']);

		await requestPasswordReset(email);
		const token = await tokenFromOutbox(email, '/reset-password');
		await resetPassword(token, 'swing-eighths-42');
		const reset = await newestMailTo(email);
		expect(reset.subject).toBe('Your Twelvefold password was reset');
		expect(reset.text).toMatch(/If it was not you, someone can read this mailbox/);
		expect(reset.links).toEqual(['http://twelvefold.test/forgot-password']);
	});
});

describe('text from strangers in mail', () => {
	const hostile = 'Claim your prize at www.prize-claim.test/now';

	test('the verification mail carries neither the sign-up name nor a link made of it', async () => {
		const email = address();
		const result = await signUp({ email, password: PASSWORD, name: hostile, role: 'learner' });
		expect(result.ok).toBe(true);
		const mail = await newestMailTo(email);
		expect(mail.subject).toBe('Confirm your e-mail address for Twelvefold');
		for (const part of [mail.subject, mail.text, mail.html ?? '']) {
			expect(part).not.toContain('prize');
			expect(part).not.toContain('Claim');
		}
		expect(mail.links).toHaveLength(1);
		expect(new URL(mail.links[0]).pathname).toBe('/verify-email');
		expect(mail.text?.startsWith('Hello,\n')).toBe(true);
	});

	test('a reset mail to an unconfirmed address has no name; once confirmed, the owner is greeted', async () => {
		const email = address();
		await signUp({ email, password: PASSWORD, name: hostile, role: 'learner' });
		const verifyToken = await tokenFromOutbox(email, '/verify-email');

		await requestPasswordReset(email);
		const before = await newestMailTo(email);
		expect(before.subject).toBe('Choose a new Twelvefold password');
		expect(`${before.text}${before.html}`).not.toContain('prize');
		expect(before.links.every((link) => new URL(link).host === 'twelvefold.test')).toBe(true);

		await verifyEmail(verifyToken);
		await requestPasswordReset(email);
		const after = await newestMailTo(email);
		expect(after.text?.startsWith(`Hello ${hostile},`)).toBe(true);
		// Even then the name is text, never the target of a link of ours.
		expect(after.links.every((link) => new URL(link).host === 'twelvefold.test')).toBe(true);
	});
});

/** The newest mail to `to`, read back from the real outbox. */
async function newestMailTo(to: string) {
	const summary = (await listMessages()).find((m) => m.to.includes(to));
	if (!summary) throw new Error(`no mail to ${to}`);
	const read = await readMessage(summary.id);
	if (!read.ok) throw new Error(`mail ${summary.id} unreadable`);
	return read.message;
}

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
