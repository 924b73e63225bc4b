import { Lucia, TimeSpan, type Adapter, type DatabaseSession, type DatabaseUser } from 'lucia';
import { Op } from 'sequelize';
import { getConfig } from '../config';
import { Session, User } from '../db/models/index';
import { createToken, hashToken } from './tokens';
import { toSessionUser, type SessionUser } from './user';

export type { SessionUser } from './user';

/** The current session (`locals.session`). */
export interface SessionInfo {
	/** The stored id: SHA-256 of the cookie's token, not the token itself. */
	id: string;
	expiresAt: Date;
	/** True when the expiry was just extended (or the session just created): resend the cookie. */
	fresh: boolean;
}

export const SESSION_COOKIE_NAME = 'twelvefold_session';
/** Sessions last 30 days and are extended when used in their second half (lucia's rule). */
const SESSION_DAYS = 30;

/** What lucia carries from the adapter to `validateSession`: the user, built once. */
type UserAttributes = Omit<SessionUser, 'id'>;

declare module 'lucia' {
	interface Register {
		Lucia: Lucia<Record<never, never>, UserAttributes>;
		DatabaseUserAttributes: UserAttributes;
	}
}

function toDatabaseSession(id: string, row: Session): DatabaseSession {
	return { id, userId: row.userId, expiresAt: row.expiresAt, attributes: {} };
}

function toDatabaseUser(row: User): DatabaseUser {
	const { id, ...attributes } = toSessionUser(row);
	return { id, attributes };
}

/**
 * lucia's seven adapter methods over our Sequelize models. Session ids arrive raw (the cookie's
 * token) and are hashed before they touch the table, so the table holds only SHA-256 digests.
 * `getUserSessions` therefore returns the stored (hashed) ids.
 */
export function createSessionAdapter(): Adapter {
	return {
		async getSessionAndUser(sessionId) {
			const row = await Session.findByPk(hashToken(sessionId), { include: [User] });
			if (!row) return [null, null];
			const user = (row as Session & { User?: User }).User;
			return [toDatabaseSession(sessionId, row), user ? toDatabaseUser(user) : null];
		},
		async getUserSessions(userId) {
			const rows = await Session.findAll({ where: { userId } });
			return rows.map((row) => toDatabaseSession(row.id, row));
		},
		async setSession(session) {
			await Session.create({
				id: hashToken(session.id),
				userId: session.userId,
				expiresAt: session.expiresAt
			});
		},
		async updateSessionExpiration(sessionId, expiresAt) {
			await Session.update({ expiresAt }, { where: { id: hashToken(sessionId) } });
		},
		async deleteSession(sessionId) {
			await Session.destroy({ where: { id: hashToken(sessionId) } });
		},
		async deleteUserSessions(userId) {
			await Session.destroy({ where: { userId } });
		},
		async deleteExpiredSessions() {
			await Session.destroy({ where: { expiresAt: { [Op.lte]: new Date() } } });
		}
	};
}

let lucia: Lucia<Record<never, never>, UserAttributes> | null = null;

/** Built on first use so that `NODE_ENV` (Secure cookies) is read at run time, not import time. */
function getLucia() {
	lucia ??= new Lucia(createSessionAdapter(), {
		sessionExpiresIn: new TimeSpan(SESSION_DAYS, 'd'),
		sessionCookie: {
			name: SESSION_COOKIE_NAME,
			attributes: { secure: getConfig().secureCookies, sameSite: 'lax' }
		},
		getUserAttributes: (attributes) => attributes
	});
	return lucia;
}

/** Start a session for a user. The token goes into the cookie and nowhere else. */
export async function createSession(
	userId: string
): Promise<{ token: string; session: SessionInfo }> {
	const token = createToken();
	const created = await getLucia().createSession(userId, {}, { sessionId: token });
	// Sign-ins are rare enough to pay for this cheap indexed delete each time.
	await getLucia().deleteExpiredSessions();
	return {
		token,
		session: { id: hashToken(token), expiresAt: created.expiresAt, fresh: true }
	};
}

export type ValidatedSession =
	{ user: SessionUser; session: SessionInfo } | { user: null; session: null };

/** Look a cookie's token up; expired sessions are removed, sessions in their second half extended. */
export async function validateSessionToken(token: string): Promise<ValidatedSession> {
	if (!token || token.length > 200) return { user: null, session: null };
	const { user, session } = await getLucia().validateSession(token);
	if (!user || !session) return { user: null, session: null };
	return {
		user,
		session: { id: hashToken(token), expiresAt: session.expiresAt, fresh: session.fresh }
	};
}

/** End one session by its stored id (`locals.session.id`). */
export async function invalidateSession(sessionId: string): Promise<void> {
	await Session.destroy({ where: { id: sessionId } });
}

/**
 * End every session of a user, through lucia. A password change or reset does not call this: it
 * deletes the sessions inside its own transaction, so the new hash and the sign-outs land together.
 */
export async function invalidateUserSessions(userId: string): Promise<void> {
	await getLucia().invalidateUserSessions(userId);
}

/** The subset of SvelteKit's `Cookies` this module needs (tests pass a plain object). */
export interface CookieJar {
	get(name: string): string | undefined;
	set(name: string, value: string, options: { path: string } & Record<string, unknown>): void;
	delete(name: string, options: { path: string } & Record<string, unknown>): void;
}

export function readSessionToken(cookies: Pick<CookieJar, 'get'>): string | null {
	return cookies.get(SESSION_COOKIE_NAME) ?? null;
}

/**
 * Sign a user in on this response: a new session, its token in the cookie. What every sign-in
 * path (form, API, sign-up) does once the password or the new account checks out.
 * @example await startSession(event.cookies, user.id)
 */
export async function startSession(cookies: CookieJar, userId: string): Promise<SessionInfo> {
	const { token, session } = await createSession(userId);
	setSessionCookie(cookies, token, session.expiresAt);
	return session;
}

export function setSessionCookie(cookies: CookieJar, token: string, expiresAt: Date): void {
	cookies.set(SESSION_COOKIE_NAME, token, {
		path: '/',
		httpOnly: true,
		sameSite: 'lax',
		secure: getConfig().secureCookies,
		expires: expiresAt
	});
}

export function deleteSessionCookie(cookies: CookieJar): void {
	cookies.delete(SESSION_COOKIE_NAME, {
		path: '/',
		httpOnly: true,
		sameSite: 'lax',
		secure: getConfig().secureCookies
	});
}
