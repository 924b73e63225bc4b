import { hash, verify } from '@node-rs/argon2';
import { Op } from 'sequelize';
import { getDb } from '../db/index';
import { Session, User } from '../db/models/index';
import { changePasswordSchema, normalizeEmail, signInSchema } from '../../forms/account';
import { parseFirst } from '../../forms/parse';
import { getConfig } from '../config';
import { sendMail } from '../mail/index';
import { passwordChangedMail } from '../mail/templates/index';
import { trySend } from './email-token';
import { checkNewPassword } from './password-strength';
import { createToken } from './tokens';
import { nameForMail } from './verification';
import { invalid, toSessionUser, type Invalid, type SessionUser } from './user';

export {
	checkPasswordLength,
	MAX_PASSWORD_LENGTH,
	MIN_PASSWORD_LENGTH,
	type PasswordCheck
} from '../../forms/account';
export { checkNewPassword } from './password-strength';

/**
 * Passwords: hashing, checking one at sign-in, changing one. The rule's text and its length
 * part are pure (`$lib/forms/account.ts`), so the form shows the rule the server applies; how
 * hard a password is to guess is `password-strength.ts`.
 *
 * argon2id with the OWASP-recommended minimum (19 MiB, 2 passes, 1 lane). `@node-rs/argon2`
 * defaults to argon2id; the parameters are written out so the stored hashes stay readable.
 */
const ARGON2_OPTIONS = { memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 };

export function hashPassword(password: string): Promise<string> {
	return hash(password, ARGON2_OPTIONS);
}

/** False for a wrong password and for a malformed stored hash alike. */
export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	try {
		return await verify(passwordHash, password);
	} catch {
		return false;
	}
}

export interface SignInInput {
	email?: unknown;
	password?: unknown;
}

export type SignInResult =
	| { ok: true; user: SessionUser }
	| Invalid
	| { ok: false; reason: 'wrong-credentials'; message: string };

// A real hash of a random password, so that an unknown address costs the same time as a known one
// (no timing oracle for which addresses have accounts).
let decoyHash: Promise<string> | null = null;

/**
 * Check an e-mail and password. Starting the session is the caller's (it owns the cookie).
 * Unverified accounts may sign in; pages that need a confirmed address check `emailVerified`.
 * @example await signIn({ email: 'ada@example.com', password: 'walking-bass-7' }) // → { ok: true, user: { … } }
 */
export async function signIn(input: SignInInput): Promise<SignInResult> {
	const read = parseFirst(signInSchema, { email: input.email, password: input.password });
	if (!read.ok) return invalid(read.field, read.message);
	const user = await User.findOne({ where: { email: normalizeEmail(read.value.email) ?? '' } });
	decoyHash ??= hashPassword(createToken());
	const matches = await verifyPassword(
		user?.passwordHash ?? (await decoyHash),
		read.value.password
	);
	if (!user || !matches) {
		return {
			ok: false,
			reason: 'wrong-credentials',
			message: 'That e-mail and password do not match an account.'
		};
	}
	return { ok: true, user: toSessionUser(user) };
}

export type ChangePasswordResult =
	| { ok: true; mailSent: boolean }
	| Invalid
	| { ok: false; reason: 'not-found' | 'conflict'; message: string };

/**
 * Change a password after checking the current one. The check and the write are one
 * compare-and-set on the stored hash (`UPDATE … WHERE id = ? AND password_hash = <the hash the
 * current password was checked against>`), so of several changes sent at once from the same
 * current password exactly one takes effect and the others are refused, on SQLite and
 * PostgreSQL alike, with one process or several. Every other session of the account ends; the
 * one given as `keepSessionId` (stored id, `locals.session.id`) stays. The owner gets a mail
 * saying so, with what to do if it was not them.
 * @example await changePassword(user.id, { currentPassword, password, confirm: password }, session.id) // → { ok: true, mailSent: true }
 */
export async function changePassword(
	userId: string,
	input: { currentPassword?: unknown; password?: unknown; confirm?: unknown },
	keepSessionId?: string,
	now = new Date()
): Promise<ChangePasswordResult> {
	const currentPassword = input.currentPassword;
	if (typeof currentPassword !== 'string' || currentPassword.length === 0) {
		return invalid('currentPassword', 'Enter your current password.');
	}
	const user = await User.findByPk(userId);
	if (!user) return { ok: false, reason: 'not-found', message: 'This account no longer exists.' };
	const checkedHash = user.passwordHash;
	if (!(await verifyPassword(checkedHash, currentPassword))) {
		return invalid('currentPassword', 'That is not your current password.');
	}
	const read = parseFirst(changePasswordSchema, {
		currentPassword,
		password: input.password,
		confirm: input.confirm ?? input.password
	});
	if (!read.ok) return invalid(read.field, read.message);
	const strength = await checkNewPassword(read.value.password, user);
	if (!strength.ok) return invalid('password', strength.message);
	const passwordHash = await hashPassword(read.value.password);
	const changed = await getDb().transaction(async (transaction) => {
		const [count] = await User.update(
			{ passwordHash },
			{ where: { id: userId, passwordHash: checkedHash }, transaction }
		);
		if (count !== 1) return false;
		await Session.destroy({
			where: keepSessionId ? { userId, id: { [Op.ne]: keepSessionId } } : { userId },
			transaction
		});
		return true;
	});
	if (!changed) {
		return {
			ok: false,
			reason: 'conflict',
			message:
				'Your password was changed by another request at the same moment, so this change was not made. Sign in again with the password you chose there, or ask for a reset link.'
		};
	}
	const mailSent = await mailPasswordChanged(user, 'changed', now);
	return { ok: true, mailSent };
}

/**
 * Tell the owner their password was changed or reset, with how to react if it was not them.
 * False when the mail could not be sent (the change stands).
 */
export function mailPasswordChanged(
	user: { email: string; name: string; emailVerifiedAt?: Date | null },
	how: 'changed' | 'reset',
	at: Date
): Promise<boolean> {
	const resetUrl = `${getConfig().baseUrl}/forgot-password`;
	return trySend(() =>
		sendMail({
			to: user.email,
			...passwordChangedMail({ name: nameForMail(user), how, at, resetUrl })
		})
	);
}
