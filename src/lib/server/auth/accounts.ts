import { Op, UniqueConstraintError } from 'sequelize';
import { getConfig } from '../config';
import { getDb } from '../db/index';
import { EmailToken, Session, User, type Role, type TokenPurpose } from '../db/models/index';
import { sendMail } from '../mail/index';
import { passwordResetMail, verificationMail } from '../mail/templates/index';
import { checkPasswordStrength, hashPassword, verifyPassword } from './password';
import { createToken, hashToken } from './tokens';
import { toSessionUser, type SessionUser } from './user';

export { toSessionUser } from './user';

/**
 * The account service: every operation on users, their passwords and their mailed links.
 * Functions take loose input (form fields, JSON), validate it themselves and answer a result
 * union; they throw only when the database fails. A mail that cannot be sent does not undo the
 * change: it comes back as `mailSent: false`, or is only logged where the answer must not differ.
 */

/** How long a mailed link works. */
export const TOKEN_LIFETIME_MS: Record<TokenPurpose, number> = {
	verify: 24 * 60 * 60 * 1000,
	reset: 60 * 60 * 1000
};

/** Roles a person may choose at sign-up; admins are made with `promoteToAdmin`. */
export const SIGN_UP_ROLES = ['learner', 'teacher'] as const satisfies readonly Role[];

export type AccountField = 'email' | 'password' | 'name' | 'role' | 'token' | 'currentPassword';

/** A rejected input: which field and a sentence to show beside it. */
export interface Invalid {
	ok: false;
	reason: 'invalid';
	field: AccountField;
	message: string;
}

const MAX_EMAIL = 254;
const MAX_NAME = 100;
// Deliberately loose: one @, something on each side, a dot in the domain, no spaces. The link we
// mail is the real check.
const EMAIL_PATTERN = /^[^\s@<>()[\],;:"]+@[^\s@<>()[\],;:"]+\.[^\s@<>()[\],;:".]+$/;

function invalid(field: AccountField, message: string): Invalid {
	return { ok: false, reason: 'invalid', field, message };
}

/**
 * The address as we store and compare it, or null when it is not one.
 *
 * @example normalizeEmail('  Ada@Example.COM ') // → 'ada@example.com'
 */
export function normalizeEmail(value: unknown): string | null {
	if (typeof value !== 'string') return null;
	const email = value.trim().toLowerCase();
	if (email.length > MAX_EMAIL || !EMAIL_PATTERN.test(email)) return null;
	return email;
}

function readName(value: unknown): string | null {
	if (typeof value !== 'string') return null;
	const name = value.trim().replace(/\s+/g, ' ');
	// eslint-disable-next-line no-control-regex
	if (name.length === 0 || name.length > MAX_NAME || /[\u0000-\u001f\u007f]/.test(name)) {
		return null;
	}
	return name;
}

function linkFor(path: string, token: string): string {
	return `${getConfig().baseUrl}${path}?token=${encodeURIComponent(token)}`;
}

/** Store a fresh single-use token for a user and return the secret for the link. */
async function issueToken(userId: string, purpose: TokenPurpose, now: Date): Promise<string> {
	const token = createToken();
	await getDb().transaction(async (transaction) => {
		// Only the newest link of each kind works: asking again voids the earlier ones.
		await EmailToken.update(
			{ usedAt: now },
			{ where: { userId, purpose, usedAt: null }, transaction }
		);
		await EmailToken.create(
			{
				id: hashToken(token),
				userId,
				purpose,
				expiresAt: new Date(now.getTime() + TOKEN_LIFETIME_MS[purpose])
			},
			{ transaction }
		);
	});
	return token;
}

export type TokenProblem = { ok: false; reason: 'bad-token'; message: string };

function badToken(message: string): TokenProblem {
	return { ok: false, reason: 'bad-token', message };
}

function isTokenShaped(token: unknown): token is string {
	return typeof token === 'string' && token.length >= 20 && token.length <= 200;
}

/** Why a stored token cannot be used at `now`, or null when it can. */
function tokenProblem(row: EmailToken | null, now: Date): TokenProblem | null {
	if (!row) return badToken('This link is not valid.');
	if (row.usedAt) return badToken('This link has already been used or replaced by a newer one.');
	if (row.expiresAt.getTime() <= now.getTime()) return badToken('This link has expired.');
	return null;
}

/**
 * Why a token cannot be used, or null when it could be right now; reads and marks nothing. For
 * callers with expensive work to do before `consumeToken`, which checks again.
 */
async function checkToken(
	token: unknown,
	purpose: TokenPurpose,
	now: Date
): Promise<TokenProblem | null> {
	if (!isTokenShaped(token)) return badToken('This link is incomplete or malformed.');
	getDb();
	return tokenProblem(await EmailToken.findOne({ where: { id: hashToken(token), purpose } }), now);
}

/** Mark a token used and return its user id, or say why it cannot be used. */
async function consumeToken(
	token: unknown,
	purpose: TokenPurpose,
	now: Date,
	then: (userId: string, transaction: import('sequelize').Transaction) => Promise<void>
): Promise<{ ok: true; userId: string } | TokenProblem> {
	if (!isTokenShaped(token)) return badToken('This link is incomplete or malformed.');
	return getDb().transaction(async (transaction) => {
		const row = await EmailToken.findOne({
			where: { id: hashToken(token), purpose },
			transaction
		});
		const problem = tokenProblem(row, now);
		if (problem) return problem;
		const usable = row as EmailToken; // tokenProblem refuses a missing row
		usable.usedAt = now;
		await usable.save({ transaction });
		await then(usable.userId, transaction);
		return { ok: true, userId: usable.userId } as const;
	});
}

/** Sending can fail (SMTP down); the account change stands and the caller can say so. */
async function trySend(send: () => Promise<void>): Promise<boolean> {
	try {
		await send();
		return true;
	} catch (error) {
		console.error('[accounts] mail could not be sent:', error);
		return false;
	}
}

async function sendVerification(user: User, now: Date): Promise<boolean> {
	const token = await issueToken(user.id, 'verify', now);
	const url = linkFor('/verify-email', token);
	return trySend(() => sendMail({ to: user.email, ...verificationMail({ name: user.name, url }) }));
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
 * Create an account (unverified) and mail the verification link.
 *
 * @example await signUp({ email: 'ada@example.com', password: 'walking-bass-7', name: 'Ada', role: 'learner' })
 * // → { ok: true, user: { email: 'ada@example.com', role: 'learner', emailVerified: false, … }, mailSent: true }
 */
export async function signUp(input: SignUpInput, now = new Date()): Promise<SignUpResult> {
	const name = readName(input.name);
	if (!name) return invalid('name', `Enter a name of 1 to ${MAX_NAME} characters.`);
	const email = normalizeEmail(input.email);
	if (!email) return invalid('email', 'Enter an e-mail address such as name@example.com.');
	if (typeof input.password !== 'string') return invalid('password', 'Enter a password.');
	const strength = checkPasswordStrength(input.password);
	if (!strength.ok) return invalid('password', strength.message);
	const role = input.role ?? 'learner';
	if (!SIGN_UP_ROLES.includes(role as (typeof SIGN_UP_ROLES)[number])) {
		return invalid('role', 'Choose whether you join as a learner or as a teacher.');
	}

	getDb();
	const taken = {
		ok: false,
		reason: 'email-taken',
		field: 'email',
		message: 'An account with this e-mail address already exists. Sign in instead.'
	} as const;
	if (await User.findOne({ where: { email } })) return taken;
	let user: User;
	try {
		user = await User.create({
			email,
			name,
			role: role as Role,
			passwordHash: await hashPassword(input.password)
		});
	} catch (error) {
		// Two sign-ups for one address at once: the unique index decides.
		if (error instanceof UniqueConstraintError) return taken;
		throw error;
	}
	const mailSent = await sendVerification(user, now);
	return { ok: true, user: toSessionUser(user), mailSent };
}

/** Mail a fresh verification link to a signed-in user who has not confirmed yet. */
export async function resendVerification(
	userId: string,
	now = new Date()
): Promise<
	{ ok: true; mailSent: boolean } | { ok: false; reason: 'not-found' | 'already-verified' }
> {
	getDb();
	const user = await User.findByPk(userId);
	if (!user) return { ok: false, reason: 'not-found' };
	if (user.emailVerifiedAt) return { ok: false, reason: 'already-verified' };
	return { ok: true, mailSent: await sendVerification(user, now) };
}

export type VerifyEmailResult = { ok: true; userId: string; already: boolean } | TokenProblem;

/**
 * Confirm an address from the mailed link; the link then stops working. Opening a used link
 * of an address that is confirmed anyway (a mail scanner may have opened it first) still
 * counts as success, with `already: true`.
 */
export async function verifyEmail(token: unknown, now = new Date()): Promise<VerifyEmailResult> {
	const result = await consumeToken(token, 'verify', now, async (userId, transaction) => {
		await User.update(
			{ emailVerifiedAt: now },
			{ where: { id: userId, emailVerifiedAt: null }, transaction }
		);
	});
	if (result.ok) return { ...result, already: false };
	if (typeof token === 'string') {
		const row = await EmailToken.findOne({
			where: { id: hashToken(token), purpose: 'verify' },
			include: [User]
		});
		const owner = (row as (EmailToken & { User?: User }) | null)?.User;
		if (row?.usedAt && owner?.emailVerifiedAt) {
			return { ok: true, userId: owner.id, already: true };
		}
	}
	return result;
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
 */
export async function signIn(input: SignInInput): Promise<SignInResult> {
	const email = normalizeEmail(input.email);
	if (!email) return invalid('email', 'Enter the e-mail address you signed up with.');
	if (typeof input.password !== 'string' || input.password.length === 0) {
		return invalid('password', 'Enter your password.');
	}
	if (input.password.length > 1000) {
		return invalid('password', 'That password is far longer than any we accept.');
	}
	getDb();
	const user = await User.findOne({ where: { email } });
	decoyHash ??= hashPassword(createToken());
	const matches = await verifyPassword(user?.passwordHash ?? (await decoyHash), input.password);
	if (!user || !matches) {
		return {
			ok: false,
			reason: 'wrong-credentials',
			message: 'That e-mail and password do not match an account.'
		};
	}
	return { ok: true, user: toSessionUser(user) };
}

/**
 * Mail a reset link if the address has an account. The answer is the same either way, so the
 * form cannot be used to find out who has an account.
 */
export async function requestPasswordReset(
	emailInput: unknown,
	now = new Date()
): Promise<{ ok: true } | Invalid> {
	const email = normalizeEmail(emailInput);
	if (!email) return invalid('email', 'Enter an e-mail address such as name@example.com.');
	getDb();
	const user = await User.findOne({ where: { email } });
	if (user) {
		const token = await issueToken(user.id, 'reset', now);
		const url = linkFor('/reset-password', token);
		await trySend(() =>
			sendMail({ to: user.email, ...passwordResetMail({ name: user.name, url }) })
		);
	}
	return { ok: true };
}

export type ResetPasswordResult = { ok: true; userId: string } | Invalid | TokenProblem;

/**
 * Set a new password from a reset link. Every session of the account ends, and the address
 * counts as confirmed (the link reached its mailbox).
 */
export async function resetPassword(
	token: unknown,
	password: unknown,
	now = new Date()
): Promise<ResetPasswordResult> {
	if (typeof password !== 'string') return invalid('password', 'Enter a new password.');
	const strength = checkPasswordStrength(password);
	if (!strength.ok) return invalid('password', strength.message);
	// The form is public and not rate limited: a made-up token is turned away before it can cost
	// an argon2 hash (19 MiB, tens of milliseconds). The hash stays outside the transaction, which
	// would otherwise hold SQLite's write lock while it runs.
	const problem = await checkToken(token, 'reset', now);
	if (problem) return problem;
	const passwordHash = await hashPassword(password);
	return consumeToken(token, 'reset', now, async (userId, transaction) => {
		const user = await User.findByPk(userId, { transaction });
		if (!user) return;
		user.passwordHash = passwordHash;
		user.emailVerifiedAt ??= now;
		await user.save({ transaction });
		await Session.destroy({ where: { userId }, transaction });
	});
}

export type ChangePasswordResult =
	{ ok: true } | Invalid | { ok: false; reason: 'not-found'; message: string };

/**
 * Change a password after checking the current one. Every other session of the account ends;
 * the one given as `keepSessionId` (stored id, `locals.session.id`) stays.
 */
export async function changePassword(
	userId: string,
	currentPassword: unknown,
	newPassword: unknown,
	keepSessionId?: string
): Promise<ChangePasswordResult> {
	if (typeof currentPassword !== 'string' || currentPassword.length === 0) {
		return invalid('currentPassword', 'Enter your current password.');
	}
	if (typeof newPassword !== 'string') return invalid('password', 'Enter a new password.');
	getDb();
	const user = await User.findByPk(userId);
	if (!user) return { ok: false, reason: 'not-found', message: 'This account no longer exists.' };
	if (!(await verifyPassword(user.passwordHash, currentPassword))) {
		return invalid('currentPassword', 'That is not your current password.');
	}
	const strength = checkPasswordStrength(newPassword);
	if (!strength.ok) return invalid('password', strength.message);
	if (newPassword === currentPassword) {
		return invalid('password', 'Choose a password different from the current one.');
	}
	user.passwordHash = await hashPassword(newPassword);
	await getDb().transaction(async (transaction) => {
		await user.save({ transaction });
		await Session.destroy({
			where: keepSessionId ? { userId, id: { [Op.ne]: keepSessionId } } : { userId },
			transaction
		});
	});
	return { ok: true };
}

export type DeleteAccountResult =
	{ ok: true } | Invalid | { ok: false; reason: 'not-found'; message: string };

/**
 * Delete an account after checking its password. The database cascades the delete to
 * everything that references the user: sessions, tokens, and the learner's practice data.
 */
export async function deleteAccount(
	userId: string,
	password: unknown
): Promise<DeleteAccountResult> {
	if (typeof password !== 'string' || password.length === 0) {
		return invalid('password', 'Enter your password to confirm.');
	}
	getDb();
	const user = await User.findByPk(userId);
	if (!user) return { ok: false, reason: 'not-found', message: 'This account no longer exists.' };
	if (!(await verifyPassword(user.passwordHash, password))) {
		return invalid('password', 'That is not your password; nothing was deleted.');
	}
	await user.destroy();
	return { ok: true };
}

export type PromoteResult =
	| { ok: true; user: SessionUser; changed: boolean }
	| { ok: false; reason: 'not-found' | 'invalid'; message: string };

/**
 * Give an account a role. Used by the admin CLI and the admin pages.
 *
 * @example await promote('ada@example.com', 'teacher') // → { ok: true, user: { role: 'teacher', … }, changed: true }
 */
export async function promote(emailInput: unknown, role: unknown): Promise<PromoteResult> {
	const email = normalizeEmail(emailInput);
	if (!email) {
		return {
			ok: false,
			reason: 'invalid',
			message: `${JSON.stringify(emailInput)} is not an e-mail address.`
		};
	}
	if (role !== 'learner' && role !== 'teacher' && role !== 'admin') {
		return {
			ok: false,
			reason: 'invalid',
			message: `${JSON.stringify(role)} is not a role; use learner, teacher or admin.`
		};
	}
	getDb();
	const user = await User.findOne({ where: { email } });
	if (!user) return { ok: false, reason: 'not-found', message: `No account uses ${email}.` };
	const changed = user.role !== role;
	if (changed) {
		user.role = role;
		await user.save();
	}
	return { ok: true, user: toSessionUser(user), changed };
}

/** `npm run admin -- promote EMAIL`: make an account an admin. */
export function promoteToAdmin(email: unknown): Promise<PromoteResult> {
	return promote(email, 'admin');
}
