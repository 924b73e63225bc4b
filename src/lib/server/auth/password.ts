import { hash, verify } from '@node-rs/argon2';
import { Op } from 'sequelize';
import { getDb } from '../db/index';
import { Session, User } from '../db/models/index';
import { changePasswordSchema, normalizeEmail, signInSchema } from '../../forms/account';
import { parseFirst } from '../../forms/parse';
import { createToken } from './tokens';
import { invalid, toSessionUser, type Invalid, type SessionUser } from './user';

export {
	checkPasswordStrength,
	MAX_PASSWORD_LENGTH,
	MIN_PASSWORD_LENGTH,
	type PasswordCheck
} from '../../forms/account';

/**
 * Passwords: hashing, checking one at sign-in, changing one. The strength rule itself is pure
 * (`$lib/forms/account.ts`), so the form shows the same rule the server applies.
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
	{ ok: true } | Invalid | { ok: false; reason: 'not-found'; message: string };

/**
 * Change a password after checking the current one. Every other session of the account ends;
 * the one given as `keepSessionId` (stored id, `locals.session.id`) stays.
 * @example await changePassword(user.id, { currentPassword, password, confirm: password }, session.id) // → { ok: true }
 */
export async function changePassword(
	userId: string,
	input: { currentPassword?: unknown; password?: unknown; confirm?: unknown },
	keepSessionId?: string
): Promise<ChangePasswordResult> {
	const currentPassword = input.currentPassword;
	if (typeof currentPassword !== 'string' || currentPassword.length === 0) {
		return invalid('currentPassword', 'Enter your current password.');
	}
	const user = await User.findByPk(userId);
	if (!user) return { ok: false, reason: 'not-found', message: 'This account no longer exists.' };
	if (!(await verifyPassword(user.passwordHash, currentPassword))) {
		return invalid('currentPassword', 'That is not your current password.');
	}
	const read = parseFirst(changePasswordSchema, {
		currentPassword,
		password: input.password,
		confirm: input.confirm ?? input.password
	});
	if (!read.ok) return invalid(read.field, read.message);
	user.passwordHash = await hashPassword(read.value.password);
	await getDb().transaction(async (transaction) => {
		await user.save({ transaction });
		await Session.destroy({
			where: keepSessionId ? { userId, id: { [Op.ne]: keepSessionId } } : { userId },
			transaction
		});
	});
	return { ok: true };
}
