import { QueryTypes } from 'sequelize';
import { normalizeEmail } from '../auth/accounts';
import { createToken, hashToken } from '../auth/tokens';
import { getConfig } from '../config';
import { getDb } from '../db/index';
import { ClassGroup, ClassInvitation } from '../db/models/index';
import { sendMail } from '../mail/index';
import { classInvitationMail } from '../mail/templates/index';
import { joinClass, type JoinedClass } from './members';
import {
	classNotFound,
	conflict,
	forbidden,
	invalid,
	isoOrNull,
	notFound,
	ownClass,
	type Actor,
	type Result
} from './common';

/**
 * Invitations by e-mail. The mail carries a token (only its SHA-256 is stored) that works for
 * whoever opens it, signed in or not: a newcomer signs up from the link, the sign-up form carries
 * the token, and the new account lands in the class.
 */

export const INVITATION_DAYS = 14;

export interface InvitationView {
	id: string;
	email: string;
	createdAt: string;
	expiresAt: string;
	acceptedAt: string | null;
}

/** The page a mailed invitation opens. */
export function invitationLinkFor(token: string): string {
	return `${getConfig().baseUrl}/join?invitation=${encodeURIComponent(token)}`;
}

/**
 * Invite someone to the actor's class by e-mail. The invitation stands even when the mail
 * cannot be sent just now (`mailSent: false`, and the teacher can send it again).
 * @example await inviteByEmail(teacher, classId, { email: 'new@example.com' }) // { ok: true, invitation: { email: 'new@example.com', … }, mailSent: true }
 */
export async function inviteByEmail(
	actor: Actor,
	classId: unknown,
	input: { email?: unknown },
	now = new Date()
): Promise<Result<{ invitation: InvitationView; mailSent: boolean }>> {
	const cls = await ownClass(actor, classId);
	if (!cls) return classNotFound;
	if (cls.archivedAt) return conflict('This class is archived; restore it before inviting anyone.');
	const email = normalizeEmail(input.email);
	if (!email) return invalid('email', 'Enter an e-mail address such as name@example.com.');
	// The mail carries the teacher's name and the class name, free text, to an address that
	// agreed to nothing: only someone whose own address is confirmed may send it.
	const [teacher] = await getDb().query<{ name: string; verified: unknown }>(
		'SELECT name, email_verified_at AS verified FROM users WHERE id = :id',
		{ replacements: { id: actor.id }, type: QueryTypes.SELECT }
	);
	if (!teacher?.verified) {
		return forbidden(
			'Confirm your own e-mail address before inviting anyone by e-mail; the join code and the invite link work meanwhile.'
		);
	}
	const token = createToken();
	const row = await ClassInvitation.create({
		classId: cls.id,
		invitedById: actor.id,
		email,
		tokenHash: hashToken(token),
		expiresAt: new Date(now.getTime() + INVITATION_DAYS * 86_400_000)
	});
	let mailSent = true;
	try {
		await sendMail({
			to: email,
			...classInvitationMail({
				teacherName: teacher.name,
				className: cls.name,
				url: invitationLinkFor(token),
				days: INVITATION_DAYS
			})
		});
	} catch (error) {
		console.error('[classes] invitation mail could not be sent:', error);
		mailSent = false;
	}
	return { ok: true, invitation: toView(row), mailSent };
}

function toView(row: ClassInvitation): InvitationView {
	return {
		id: row.id,
		email: row.email,
		createdAt: isoOrNull(row.createdAt) ?? '',
		expiresAt: isoOrNull(row.expiresAt) ?? '',
		acceptedAt: isoOrNull(row.acceptedAt)
	};
}

/** The invitations of the actor's class, newest first. */
export async function listInvitations(
	actor: Actor,
	classId: unknown
): Promise<Result<{ items: InvitationView[]; total: number }>> {
	const cls = await ownClass(actor, classId);
	if (!cls) return classNotFound;
	const rows = await ClassInvitation.findAll({
		where: { classId: cls.id },
		order: [['createdAt', 'DESC']],
		limit: 200
	});
	const items = rows.map(toView);
	return { ok: true, items, total: items.length };
}

function tokenShaped(token: unknown): token is string {
	return typeof token === 'string' && token.length >= 20 && token.length <= 200;
}

export interface InvitationPreview {
	className: string;
	teacherName: string;
	email: string;
	/** 'open' can be accepted; the others say why not. */
	status: 'open' | 'accepted' | 'expired' | 'archived';
}

/** What a mailed link invites to, for the page it opens (no account needed to see it). */
export async function previewInvitation(
	token: unknown,
	now = new Date()
): Promise<InvitationPreview | null> {
	if (!tokenShaped(token)) return null;
	const [row] = await getDb().query<{
		email: string;
		expires_at: unknown;
		accepted_at: unknown;
		class_name: string;
		archived_at: unknown;
		teacher_name: string;
	}>(
		`SELECT i.email, i.expires_at, i.accepted_at, c.name AS class_name, c.archived_at,
		        u.name AS teacher_name
		   FROM class_invitations i JOIN classes c ON c.id = i.class_id
		   JOIN users u ON u.id = c.teacher_id
		  WHERE i.token_hash = :hash`,
		{ replacements: { hash: hashToken(token) }, type: QueryTypes.SELECT }
	);
	if (!row) return null;
	const expires = new Date(isoOrNull(row.expires_at) ?? 0).getTime();
	const status =
		row.archived_at !== null
			? 'archived'
			: row.accepted_at !== null
				? 'accepted'
				: expires <= now.getTime()
					? 'expired'
					: 'open';
	return { className: row.class_name, teacherName: row.teacher_name, email: row.email, status };
}

/**
 * Accept a mailed invitation as the signed-in actor (whoever holds the link may use it once).
 * @example await acceptInvitation(newLearner, token) // { ok: true, className: 'Tuesday combo', joined: true }
 */
export async function acceptInvitation(
	actor: Actor,
	token: unknown,
	now = new Date()
): Promise<Result<JoinedClass>> {
	if (!tokenShaped(token)) return notFound('This invitation link is incomplete.');
	const row = await ClassInvitation.findOne({ where: { tokenHash: hashToken(token) } });
	if (!row) return notFound('This invitation link is not valid.');
	if (row.expiresAt.getTime() <= now.getTime() && !row.acceptedAt) {
		return conflict('This invitation has expired: ask your teacher to send a new one.');
	}
	const cls = await ClassGroup.findByPk(row.classId);
	if (!cls) return notFound('This class no longer exists.');
	if (row.acceptedAt) {
		// The same person opening the mail again is simply in the class already.
		const again = await joinClass(actor.id, cls, now);
		if (again.ok && !again.joined) return again;
		return conflict(
			'This invitation has already been used. Ask your teacher for a new one or use the class code.'
		);
	}
	// Compare-and-set: only one acceptance of a token wins, however many tabs try at once.
	const [claimed] = await ClassInvitation.update(
		{ acceptedAt: now },
		{ where: { id: row.id, acceptedAt: null } }
	);
	if (claimed === 0) return conflict('This invitation has already been used.');
	const joined = await joinClass(actor.id, cls, now);
	if (!joined.ok) {
		await ClassInvitation.update({ acceptedAt: null }, { where: { id: row.id } });
	}
	return joined;
}
