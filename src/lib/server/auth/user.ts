import { UniqueConstraintError } from 'sequelize';
import type { User } from '../db/models/index';
import { User as UserModel } from '../db/models/index';
import {
	ROLES,
	deleteAccountSchema,
	normalizeEmail,
	normalizeName,
	setRoleSchema,
	signUpSchema,
	type Role
} from '../../forms/account';
import { parseFirst } from '../../forms/parse';
import type { UserSettings } from '../../practice/settings';
import { settingsOf } from '../study/settings';
import { hashPassword, verifyPassword } from './password';
import { checkNewPassword } from './password-strength';
import { sendVerification } from './verification';

/**
 * Accounts: the user object pages see, creating, deleting and giving roles. Functions take loose
 * input (form fields, JSON), check it against the form's own schema and answer a result union;
 * they throw only when the database fails. A mail that cannot be sent does not undo the change:
 * it comes back as `mailSent: false`.
 */

/** The signed-in person as pages and endpoints see them (`locals.user`). */
export interface SessionUser {
	id: string;
	email: string;
	name: string;
	role: Role;
	emailVerified: boolean;
	/** Normalised once, when the row is read: routes use these and never parse storage. */
	settings: UserSettings;
}

/**
 * The user as services hand it out, built in this one place from a row: never the password hash.
 * @example toSessionUser(row) // → { id: '…', email: 'ada@example.com', role: 'learner', emailVerified: false, settings: { … } }
 */
export function toSessionUser(row: User): SessionUser {
	return {
		id: row.id,
		email: row.email,
		name: row.name,
		role: row.role,
		emailVerified: row.emailVerifiedAt instanceof Date,
		settings: settingsOf(row)
	};
}

export type AccountField =
	| 'email'
	| 'password'
	| 'name'
	| 'role'
	| 'token'
	| 'currentPassword'
	| 'confirm'
	| 'confirmEmail'
	| 'deletePassword';

/** A rejected input: which field and a sentence to show beside it. */
export interface Invalid {
	ok: false;
	reason: 'invalid';
	field: AccountField;
	message: string;
}

export function invalid(field: string, message: string): Invalid {
	return { ok: false, reason: 'invalid', field: field as AccountField, message };
}

export interface SignUpInput {
	email?: unknown;
	password?: unknown;
	name?: unknown;
	role?: unknown;
}

export type SignUpResult =
	| { ok: true; user: SessionUser; mailSent: boolean }
	| Invalid
	| { ok: false; reason: 'email-taken'; field: 'email'; message: string };

/**
 * Create an account (unverified) and mail the verification link. The unique index on the address
 * decides between two sign-ups for one address at once.
 *
 * @example await signUp({ email: 'ada@example.com', password: 'walking-bass-7', name: 'Ada', role: 'learner' })
 * // → { ok: true, user: { email: 'ada@example.com', role: 'learner', emailVerified: false, … }, mailSent: true }
 */
export async function signUp(input: SignUpInput, now = new Date()): Promise<SignUpResult> {
	const read = parseFirst(signUpSchema, input);
	if (!read.ok) return invalid(read.field, read.message);
	const email = normalizeEmail(read.value.email) as string;
	const name = normalizeName(read.value.name) as string;
	const strength = await checkNewPassword(read.value.password, { name, email });
	if (!strength.ok) return invalid('password', strength.message);
	const taken = {
		ok: false,
		reason: 'email-taken',
		field: 'email',
		message: 'An account with this e-mail address already exists. Sign in instead.'
	} as const;
	let user: User;
	try {
		user = await UserModel.create({
			email,
			name,
			role: read.value.role,
			passwordHash: await hashPassword(read.value.password)
		});
	} catch (error) {
		if (error instanceof UniqueConstraintError) return taken;
		throw error;
	}
	const mailSent = await sendVerification(user, now);
	return { ok: true, user: toSessionUser(user), mailSent };
}

export type DeleteAccountResult =
	{ ok: true } | Invalid | { ok: false; reason: 'not-found'; message: string };

/**
 * Delete one's own account: the address typed out exactly and the password. The database
 * cascades the delete to everything that references the user: sessions, tokens, practice data.
 * @example await deleteAccount(user, { confirmEmail: user.email, deletePassword: 'walking-bass-7' }) // → { ok: true }
 */
export async function deleteAccount(
	actor: { id: string; email: string },
	input: { confirmEmail?: unknown; deletePassword?: unknown }
): Promise<DeleteAccountResult> {
	const read = parseFirst(deleteAccountSchema, input);
	if (!read.ok) return invalid(read.field, read.message);
	if (read.value.confirmEmail.trim().toLowerCase() !== actor.email) {
		return invalid(
			'confirmEmail',
			'Type your e-mail address exactly to confirm; nothing was deleted.'
		);
	}
	const user = await UserModel.findByPk(actor.id);
	if (!user) return { ok: false, reason: 'not-found', message: 'This account no longer exists.' };
	if (!(await verifyPassword(user.passwordHash, read.value.deletePassword))) {
		return invalid('deletePassword', 'That is not your password; nothing was deleted.');
	}
	await user.destroy();
	return { ok: true };
}

export type SetRoleResult =
	| { ok: true; user: SessionUser; changed: boolean }
	| { ok: false; reason: 'not-found' | 'invalid' | 'own-role'; message: string };

/**
 * Give an account a role (up or down). `actor` is the admin doing it, or null for the command
 * line; an admin cannot change their own role, so the site never loses its last admin by a slip.
 *
 * @example await setRole(admin, { email: 'ada@example.com', role: 'teacher' }) // → { ok: true, user: { role: 'teacher', … }, changed: true }
 */
export async function setRole(
	actor: { email: string } | null,
	input: { email?: unknown; role?: unknown }
): Promise<SetRoleResult> {
	const email = normalizeEmail(input.email);
	if (!email) {
		return {
			ok: false,
			reason: 'invalid',
			message: `${JSON.stringify(input.email)} is not an e-mail address.`
		};
	}
	const read = parseFirst(setRoleSchema, { email, role: input.role });
	if (!read.ok) {
		return {
			ok: false,
			reason: 'invalid',
			message: `${JSON.stringify(input.role)} is not a role; use ${ROLES.join(', ').replace(/, (\w+)$/, ' or $1')}.`
		};
	}
	if (actor && actor.email === email) {
		return {
			ok: false,
			reason: 'own-role',
			message: 'You cannot change your own role; ask another admin.'
		};
	}
	const user = await UserModel.findOne({ where: { email } });
	if (!user) return { ok: false, reason: 'not-found', message: `No account uses ${email}.` };
	const changed = user.role !== read.value.role;
	if (changed) {
		user.role = read.value.role;
		await user.save();
	}
	return { ok: true, user: toSessionUser(user), changed };
}

/** `npm run admin -- promote EMAIL`: make an account an admin. */
export function makeAdmin(email: unknown): Promise<SetRoleResult> {
	return setRole(null, { email, role: 'admin' });
}
