import { QueryTypes, UniqueConstraintError } from 'sequelize';
import { getDb } from '../db/index';
import { Assignment, ClassGroup, ClassMember } from '../db/models/index';
import { createAssignmentCards, retireNewCards } from './class-cards';
import { normalizeJoinCode } from './classes';
import {
	assignmentIdsOf,
	classNotFound,
	conflict,
	invalid,
	isId,
	isoOrNull,
	notFound,
	ownClass,
	type Actor,
	type Result
} from './common';

/**
 * Who is in a class. A learner joins by code, invite link or mailed invitation (all three end in
 * `joinClass`) and leaves whenever they like; the teacher lists members and removes one. Joining
 * makes the learner's cards for every assignment; leaving or being removed retires the ones not
 * yet introduced. Reviews always stay with the learner.
 */

export interface MemberView {
	userId: string;
	name: string;
	email: string;
	joinedAt: string;
}

export interface JoinedClass {
	classId: string;
	className: string;
	teacherName: string;
	/** False when the learner was already a member (joining twice changes nothing). */
	joined: boolean;
}

/**
 * The members of the actor's class, by name.
 * @example await listMembers(teacher, classId) // { ok: true, items: [{ name: 'Ines Kowal', … }], total: 3 }
 */
export async function listMembers(
	actor: Actor,
	classId: unknown
): Promise<Result<{ items: MemberView[]; total: number }>> {
	const cls = await ownClass(actor, classId);
	if (!cls) return classNotFound;
	const rows = await getDb().query<{
		user_id: string;
		name: string;
		email: string;
		joined_at: unknown;
	}>(
		`SELECT m.user_id, u.name, u.email, m.joined_at
		   FROM class_members m JOIN users u ON u.id = m.user_id
		  WHERE m.class_id = :classId ORDER BY u.name, u.id`,
		{ replacements: { classId: cls.id }, type: QueryTypes.SELECT }
	);
	const items = rows.map((r) => ({
		userId: r.user_id,
		name: r.name,
		email: r.email,
		joinedAt: isoOrNull(r.joined_at) ?? ''
	}));
	return { ok: true, items, total: items.length };
}

/**
 * Put `userId` in a class and make their cards for its assignments. Idempotent: the unique
 * (class, user) pair decides, so a double click or two tabs join once.
 */
export async function joinClass(
	userId: string,
	cls: ClassGroup,
	now = new Date()
): Promise<Result<JoinedClass>> {
	if (cls.archivedAt) return conflict('This class is archived and takes no new members.');
	if (cls.teacherId === userId) return conflict('You teach this class; learners join it.');
	const joined = await getDb().transaction(async (transaction) => {
		try {
			await ClassMember.create({ classId: cls.id, userId, joinedAt: now }, { transaction });
		} catch (error) {
			if (error instanceof UniqueConstraintError) return false;
			throw error;
		}
		const assignments = await Assignment.findAll({ where: { classId: cls.id }, transaction });
		for (const a of assignments) {
			await createAssignmentCards(
				{ id: a.id, deckId: a.deckId, qualities: a.qualities ?? [] },
				[userId],
				now,
				transaction
			);
		}
		return true;
	});
	const [teacher] = await getDb().query<{ name: string }>('SELECT name FROM users WHERE id = :id', {
		replacements: { id: cls.teacherId },
		type: QueryTypes.SELECT
	});
	return {
		ok: true,
		classId: cls.id,
		className: cls.name,
		teacherName: teacher?.name ?? '',
		joined
	};
}

const codeMessage = 'Enter the 8-character class code your teacher gave you.';

/**
 * Join a class by the short code its teacher handed out.
 * @example await joinByCode(learner, 'k7mq-x4pa') // { ok: true, className: 'Tuesday combo', joined: true }
 */
export async function joinByCode(actor: Actor, codeInput: unknown): Promise<Result<JoinedClass>> {
	const code = normalizeJoinCode(codeInput);
	if (!code) return invalid('code', codeMessage);
	const cls = await ClassGroup.findOne({ where: { joinCode: code } });
	if (!cls)
		return notFound('No class has this code. Check it with your teacher: codes can be renewed.');
	return joinClass(actor.id, cls);
}

/** The class an invite-link token opens, for the page that asks "join this class?". */
export async function classForLink(
	token: unknown
): Promise<{ id: string; name: string; teacherName: string; archived: boolean } | null> {
	if (typeof token !== 'string' || token.length < 20 || token.length > 64) return null;
	const [row] = await getDb().query<{
		id: string;
		name: string;
		teacher_name: string;
		archived_at: unknown;
	}>(
		`SELECT c.id, c.name, u.name AS teacher_name, c.archived_at
		   FROM classes c JOIN users u ON u.id = c.teacher_id WHERE c.join_token = :token`,
		{ replacements: { token }, type: QueryTypes.SELECT }
	);
	return row
		? {
				id: row.id,
				name: row.name,
				teacherName: row.teacher_name,
				archived: row.archived_at !== null
			}
		: null;
}

/** Join through the class's invite link. */
export async function joinByLink(actor: Actor, token: unknown): Promise<Result<JoinedClass>> {
	if (typeof token !== 'string' || token.length < 20 || token.length > 64) {
		return notFound('This invite link is incomplete.');
	}
	const cls = await ClassGroup.findOne({ where: { joinToken: token } });
	if (!cls) return notFound('This invite link no longer works: ask your teacher for a new one.');
	return joinClass(actor.id, cls);
}

/**
 * Leave a class: the learner's new cards from it retire, everything practised stays theirs.
 * @example await leaveClass(learner, classId) // { ok: true, retired: 6 }
 */
export async function leaveClass(
	actor: Actor,
	classId: unknown,
	now = new Date()
): Promise<Result<{ retired: number }>> {
	if (!isId(classId)) return classNotFound;
	return removeFromClass(classId, actor.id, now);
}

async function removeFromClass(
	classId: string,
	userId: string,
	now: Date
): Promise<Result<{ retired: number }>> {
	return getDb().transaction(async (transaction) => {
		const gone = await ClassMember.destroy({ where: { classId, userId }, transaction });
		if (gone === 0) return notFound('Not a member of this class.');
		const retired = await retireNewCards(
			await assignmentIdsOf(classId, transaction),
			[userId],
			now,
			transaction
		);
		return { ok: true as const, retired };
	});
}

/**
 * The teacher removes a member (or a learner removes themselves: the same as leaving).
 * @example await removeMember(teacher, classId, learnerId) // { ok: true, retired: 6 }
 */
export async function removeMember(
	actor: Actor,
	classId: unknown,
	userId: unknown,
	now = new Date()
): Promise<Result<{ retired: number }>> {
	if (!isId(userId)) return notFound('Not a member of this class.');
	if (userId === actor.id) return leaveClass(actor, classId, now);
	const cls = await ownClass(actor, classId);
	if (!cls) return classNotFound;
	return removeFromClass(cls.id, userId, now);
}
