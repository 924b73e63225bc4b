import { Session, User } from '../db/models/index';
import { forgotPasswordSchema, normalizeEmail, resetPasswordSchema } from '../../forms/account';
import { parseFirst } from '../../forms/parse';
import { enqueueJob } from '../jobs';
import { sendMail } from '../mail/index';
import { passwordResetMail } from '../mail/templates/index';
import {
	checkToken,
	consumeToken,
	issueToken,
	linkFor,
	trySend,
	type TokenProblem
} from './email-token';
import { hashPassword, mailPasswordChanged } from './password';
import { checkNewPassword } from './password-strength';
import { nameForMail } from './verification';
import { invalid, type Invalid } from './user';

/** Resetting a forgotten password through a mailed link. */

/** Issue a reset token and mail its link, if the address (already normalised) has an account. */
async function mailResetLink(email: string, now: Date): Promise<void> {
	const user = await User.findOne({ where: { email } });
	if (!user) return;
	const token = await issueToken(user.id, 'reset', now);
	const url = linkFor('/reset-password', token);
	await sendMail({ to: user.email, ...passwordResetMail({ name: nameForMail(user), url }) });
}

/**
 * Mail a reset link if the address has an account, and wait until it is done. The answer is the
 * same either way (a failure is logged, not reported), so the answer cannot tell who has an
 * account; its time still can: pages use `queuePasswordReset`.
 * @example await requestPasswordReset('ada@example.com') // → { ok: true }
 */
export async function requestPasswordReset(
	emailInput: unknown,
	now = new Date()
): Promise<{ ok: true } | Invalid> {
	const read = parseFirst(forgotPasswordSchema, { email: emailInput });
	if (!read.ok) return invalid(read.field, read.message);
	await trySend(() => mailResetLink(normalizeEmail(read.value.email) ?? '', now));
	return { ok: true };
}

/**
 * Check the address and queue the look-up, the token and the mail to run after answering: a
 * known address and an unknown one then take the same time to answer (the job queue logs and
 * retries a mail that fails).
 * @example queuePasswordReset('ada@example.com') // → { ok: true }, the mail follows
 */
export function queuePasswordReset(emailInput: unknown): { ok: true } | Invalid {
	const read = parseFirst(forgotPasswordSchema, { email: emailInput });
	if (!read.ok) return invalid(read.field, read.message);
	const email = normalizeEmail(read.value.email) ?? '';
	enqueueJob({ name: 'password reset mail', run: () => mailResetLink(email, new Date()) });
	return { ok: true };
}

export type ResetPasswordResult =
	{ ok: true; userId: string; mailSent: boolean } | Invalid | TokenProblem;

/**
 * Set a new password from a reset link. Every session of the account ends, and the address
 * counts as confirmed (the link reached its mailbox). `confirm`, when given, must match. The
 * owner gets a mail saying the password was reset, with what to do if it was not them.
 * @example await resetPassword(token, 'comping-chords-9') // → { ok: true, userId: '…', mailSent: true }
 */
export async function resetPassword(
	token: unknown,
	password: unknown,
	now = new Date(),
	confirm: unknown = password
): Promise<ResetPasswordResult> {
	const read = parseFirst(resetPasswordSchema, { token: '', password, confirm });
	if (!read.ok) return invalid(read.field, read.message);
	// The form is public and not rate limited: a made-up token is turned away before it can cost
	// a strength check or an argon2 hash (19 MiB, tens of milliseconds). The hash stays outside
	// the transaction, which would otherwise hold SQLite's write lock while it runs.
	const live = await checkToken(token, 'reset', now);
	if (!live.ok) return live;
	const owner = await User.findByPk(live.userId);
	const strength = await checkNewPassword(read.value.password, owner ?? {});
	if (!strength.ok) return invalid('password', strength.message);
	const passwordHash = await hashPassword(read.value.password);
	let changed: User | null = null;
	const result = await consumeToken(token, 'reset', now, async (userId, transaction) => {
		const user = await User.findByPk(userId, { transaction });
		if (!user) return;
		user.passwordHash = passwordHash;
		user.emailVerifiedAt ??= now;
		await user.save({ transaction });
		await Session.destroy({ where: { userId }, transaction });
		changed = user;
	});
	if (!result.ok) return result;
	const mailSent = changed ? await mailPasswordChanged(changed, 'reset', now) : false;
	return { ...result, mailSent };
}
