import { EmailToken, User } from '../db/models/index';
import { sendMail } from '../mail/index';
import { verificationMail } from '../mail/templates/index';
import { consumeToken, issueToken, linkFor, trySend, type TokenProblem } from './email-token';
import { hashToken } from './tokens';

/** Confirming an e-mail address through a mailed link. */

/**
 * The name to greet someone by in a mail: none while their address is unconfirmed, since then
 * the name is text from whoever typed the address, and the mailbox agreed to nothing.
 */
export function nameForMail(user: { name: string; emailVerifiedAt?: Date | null }): string | null {
	return user.emailVerifiedAt instanceof Date ? user.name : null;
}

/** Mail a fresh confirmation link; false when the mail could not be sent. */
export async function sendVerification(
	user: { id: string; email: string },
	now: Date
): Promise<boolean> {
	const token = await issueToken(user.id, 'verify', now);
	const url = linkFor('/verify-email', token);
	return trySend(() => sendMail({ to: user.email, ...verificationMail({ url }) }));
}

/**
 * Mail a fresh verification link to a signed-in user who has not confirmed yet.
 * @example await resendVerification(user.id) // → { ok: true, mailSent: true }
 */
export async function resendVerification(
	userId: string,
	now = new Date()
): Promise<
	{ ok: true; mailSent: boolean } | { ok: false; reason: 'not-found' | 'already-verified' }
> {
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
 * @example await verifyEmail(token) // → { ok: true, userId: '…', already: false }
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
