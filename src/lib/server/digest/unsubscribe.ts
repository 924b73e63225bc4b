import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import { getConfig } from '../config';

import { User } from '../db/models/index';
import { setMailChoice } from './choices';
import { writeAlone } from './sql';

/**
 * Unsubscribe links that work without signing in. A link carries `userId.kind.signature`, the
 * signature an HMAC-SHA256 of the user and the kind of mail under that person's own secret
 * (`users.mail_secret`), so a link turns off one kind of mail for one person and nothing else,
 * and nobody can make one for somebody else. Links do not expire: a reader may act on a mail
 * from last month.
 */

export { MAIL_CHOICES, MAIL_CHOICE_NAMES, type MailChoice } from './choices';
import type { MailChoice } from './choices';

function sign(secret: string, userId: string, kind: MailChoice): string {
	return createHmac('sha256', secret).update(`unsubscribe:${userId}:${kind}`).digest('base64url');
}

/**
 * The person's signing secret, made on first use. Two processes making one at once both write
 * only where none is stored yet (compare-and-set), then read back the one that won.
 * @example await ensureMailSecret(user.id) // 'b3…' (43 characters)
 */
export async function ensureMailSecret(userId: string): Promise<string> {
	const row = await User.findByPk(userId, { attributes: ['id', 'mailSecret'] });
	if (!row) throw new Error(`No user ${userId} to sign a mail link for`);
	if (row.mailSecret) return row.mailSecret;
	await writeAlone(
		'UPDATE users SET mail_secret = :secret WHERE id = :id AND mail_secret IS NULL',
		{
			secret: randomBytes(32).toString('base64url'),
			id: userId
		}
	);
	const stored = await User.findByPk(userId, { attributes: ['id', 'mailSecret'] });
	return stored!.mailSecret!;
}

/**
 * The token for one person and kind of mail.
 * @example unsubscribeToken('9f1c…', 'digest', secret) // '9f1c….digest.Xy…'
 */
export function unsubscribeToken(userId: string, kind: MailChoice, secret: string): string {
	return `${userId}.${kind}.${sign(secret, userId, kind)}`;
}

/** The two addresses of an unsubscribe: a page for a person, a one-click endpoint for a client. */
export interface UnsubscribeLinks {
	/** Opens a page that names the mail and turns it off with one button. */
	page: string;
	/** Takes the RFC 8058 one-click POST from a mail client and answers with no page. */
	oneClick: string;
}

/**
 * The links that go into a mail.
 * @example unsubscribeLinks(token).page // 'https://…/unsubscribe?token=…'
 */
export function unsubscribeLinks(token: string): UnsubscribeLinks {
	const { baseUrl } = getConfig();
	const query = `token=${encodeURIComponent(token)}`;
	return {
		page: `${baseUrl}/unsubscribe?${query}`,
		oneClick: `${baseUrl}/api/unsubscribe?${query}`
	};
}

export type ReadTokenResult =
	| { ok: true; userId: string; kind: MailChoice; name: string; email: string; enabled: boolean }
	| { ok: false; message: string };

const TOKEN_SHAPE = /^([0-9a-f-]{36})\.(digest|summary)\.([A-Za-z0-9_-]{43})$/;

/**
 * Who and what a token names, when its signature holds.
 * @example await readUnsubscribeToken('nonsense') // { ok: false, message: 'This unsubscribe link is not complete…' }
 */
export async function readUnsubscribeToken(token: unknown): Promise<ReadTokenResult> {
	const match = typeof token === 'string' ? TOKEN_SHAPE.exec(token) : null;
	if (!match) {
		return {
			ok: false,
			message:
				'This unsubscribe link is not complete. Open it from the mail again, or change your mail in Settings.'
		};
	}
	const [, userId, kind, signature] = match as unknown as [string, string, MailChoice, string];
	const user = await User.findByPk(userId, {
		attributes: ['id', 'name', 'email', 'mailSecret', 'digestEnabled', 'summaryEnabled']
	});
	const expected = user?.mailSecret ? Buffer.from(sign(user.mailSecret, userId, kind)) : null;
	const given = Buffer.from(signature);
	if (!user || !expected || expected.length !== given.length || !timingSafeEqual(expected, given)) {
		return {
			ok: false,
			message:
				'This unsubscribe link is not valid (the account may have been deleted). Sign in to change your mail in Settings.'
		};
	}
	return {
		ok: true,
		userId,
		kind,
		name: user.name,
		email: user.email,
		enabled: kind === 'digest' ? user.digestEnabled : user.summaryEnabled
	};
}

export type UnsubscribeResult =
	{ ok: true; kind: MailChoice; changed: boolean; email: string } | { ok: false; message: string };

/**
 * Follow an unsubscribe link (or undo one with `enabled: true`): check the token, set the choice.
 * @example await unsubscribe(token) // { ok: true, kind: 'digest', changed: true, email: 'ada@…' }
 */
export async function unsubscribe(token: unknown, enabled = false): Promise<UnsubscribeResult> {
	const read = await readUnsubscribeToken(token);
	if (!read.ok) return read;
	const changed = await setMailChoice(read.userId, read.kind, enabled);
	return { ok: true, kind: read.kind, changed, email: read.email };
}
