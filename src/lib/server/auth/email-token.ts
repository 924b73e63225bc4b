import { Op, UniqueConstraintError, type Transaction } from 'sequelize';
import { getConfig } from '../config';
import { getDb } from '../db/index';
import { EmailToken, User, type TokenPurpose } from '../db/models/index';
import { createToken, hashToken } from './tokens';
import { LINK_LIFETIME_MS } from '../../forms/account';

/**
 * Single-use links sent by mail (confirm an address, reset a password). Only the newest link of
 * each kind works, and a link works once; both rules hold in the database (a partial unique
 * index on the live token of a user and purpose, a compare-and-set on `used_at`), so they hold
 * on PostgreSQL and with several processes, not only in this one.
 */

/** How long a mailed link works (the pages and mails say the same, from the same constant). */
export const TOKEN_LIFETIME_MS: Record<TokenPurpose, number> = LINK_LIFETIME_MS;

export type TokenProblem = { ok: false; reason: 'bad-token'; message: string };

function badToken(message: string): TokenProblem {
	return { ok: false, reason: 'bad-token', message };
}

/** The address a mailed link opens. */
export function linkFor(path: string, token: string): string {
	return `${getConfig().baseUrl}${path}?token=${encodeURIComponent(token)}`;
}

/**
 * Store a fresh single-use token for a user and return the secret for the link; earlier live
 * tokens of the same purpose stop working. The partial unique index on the live token is what
 * guarantees one working link; should two requests still meet there, the loser tries again.
 * @example await issueToken(user.id, 'reset', new Date()) // → 'q3Jw…' (43 characters)
 */
export async function issueToken(
	userId: string,
	purpose: TokenPurpose,
	now: Date
): Promise<string> {
	const token = createToken();
	for (let attempt = 0; ; attempt++) {
		try {
			await getDb().transaction(async (transaction) => {
				// Requests for one person queue on their row (PostgreSQL; SQLite has one writer
				// anyway), so fifty at once do not keep colliding on the index below.
				await User.findByPk(userId, {
					attributes: ['id'],
					lock: transaction.LOCK.UPDATE,
					transaction
				});
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
		} catch (error) {
			if (!(error instanceof UniqueConstraintError) || attempt >= 5) throw error;
		}
	}
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
 * The owner of a token that could be used right now, or why it cannot; reads and marks nothing.
 * For callers with work to do before `consumeToken` decides (a password to check against its
 * owner and hash), and for a page that should say at once that its link is spent.
 */
export async function checkToken(
	token: unknown,
	purpose: TokenPurpose,
	now: Date
): Promise<{ ok: true; userId: string } | TokenProblem> {
	if (!isTokenShaped(token)) return badToken('This link is incomplete or malformed.');
	const row = await EmailToken.findOne({ where: { id: hashToken(token), purpose } });
	return tokenProblem(row, now) ?? { ok: true, userId: (row as EmailToken).userId };
}

/**
 * Use a token once: a compare-and-set marks it used only if it is still live, so of two requests
 * with one link exactly one goes on to `then` (in the same transaction).
 */
export async function consumeToken(
	token: unknown,
	purpose: TokenPurpose,
	now: Date,
	then: (userId: string, transaction: Transaction) => Promise<void>
): Promise<{ ok: true; userId: string } | TokenProblem> {
	if (!isTokenShaped(token)) return badToken('This link is incomplete or malformed.');
	const id = hashToken(token);
	return getDb().transaction(async (transaction) => {
		const [used] = await EmailToken.update(
			{ usedAt: now },
			{ where: { id, purpose, usedAt: null, expiresAt: { [Op.gt]: now } }, transaction }
		);
		const row = await EmailToken.findOne({ where: { id, purpose }, transaction });
		if (used !== 1 || !row) return tokenProblem(row, now) ?? badToken('This link is not valid.');
		await then(row.userId, transaction);
		return { ok: true, userId: row.userId } as const;
	});
}

/** Sending can fail (SMTP down); the account change stands and the caller can say so. */
export async function trySend(send: () => Promise<void>): Promise<boolean> {
	try {
		await send();
		return true;
	} catch (error) {
		console.error('[accounts] mail could not be sent:', error);
		return false;
	}
}
