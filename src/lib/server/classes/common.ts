import { QueryTypes, type Transaction } from 'sequelize';
import { getDb } from '../db/index';
import { ClassGroup, ClassMember, type Role } from '../db/models/index';

/**
 * What the class services share: the acting user, the result union every function answers, and
 * the two ownership checks (a teacher's own class, a learner's membership) that every one of them
 * runs before it touches a row.
 */

/** Who is acting: the signed-in user as the session hands it out. */
export interface Actor {
	id: string;
	role: Role;
	name?: string;
}

export type Refusal =
	/** No such row, or one the actor may not know about (another teacher's class: the same). */
	| { ok: false; reason: 'not-found'; message: string }
	/** The actor's role may not do this at all (a learner creating a class). */
	| { ok: false; reason: 'forbidden'; message: string }
	| { ok: false; reason: 'invalid'; field: string; message: string }
	/** The request is well formed but the state forbids it (joining an archived class). */
	| { ok: false; reason: 'conflict'; message: string };

export type Result<T> = ({ ok: true } & T) | Refusal;

export const notFound = (message: string): Refusal => ({ ok: false, reason: 'not-found', message });
export const forbidden = (message: string): Refusal => ({
	ok: false,
	reason: 'forbidden',
	message
});
export const conflict = (message: string): Refusal => ({ ok: false, reason: 'conflict', message });
export const invalid = (field: string, message: string): Refusal => ({
	ok: false,
	reason: 'invalid',
	field,
	message
});

/** Teachers and admins run classes. */
export function canTeach(actor: Actor): boolean {
	return actor.role === 'teacher' || actor.role === 'admin';
}

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Ids come from URLs: anything that is not a UUID is simply not found (and never reaches SQL). */
export function isId(value: unknown): value is string {
	return typeof value === 'string' && uuidPattern.test(value);
}

export const classNotFound = notFound('No such class among yours.');

/**
 * The class if `actor` teaches it; null otherwise (another teacher's class looks missing).
 * @example await ownClass(teacher, classId) // ClassGroup row or null
 */
export async function ownClass(
	actor: Actor,
	classId: unknown,
	transaction?: Transaction
): Promise<ClassGroup | null> {
	if (!isId(classId) || !canTeach(actor)) return null;
	return ClassGroup.findOne({ where: { id: classId, teacherId: actor.id }, transaction });
}

/** Whether `userId` is a member of `classId`. */
export async function isMember(
	userId: string,
	classId: string,
	transaction?: Transaction
): Promise<boolean> {
	return (await ClassMember.count({ where: { classId, userId }, transaction })) > 0;
}

/**
 * The class if `actor` teaches it or belongs to it, with which of the two; null otherwise.
 * @example await visibleClass(learner, classId) // { row, as: 'learner' }
 */
export async function visibleClass(
	actor: Actor,
	classId: unknown
): Promise<{ row: ClassGroup; as: 'teacher' | 'learner' } | null> {
	if (!isId(classId)) return null;
	const row = await ClassGroup.findByPk(classId);
	if (!row) return null;
	if (row.teacherId === actor.id && canTeach(actor)) return { row, as: 'teacher' };
	if (await isMember(actor.id, classId)) return { row, as: 'learner' };
	return null;
}

/** Ids of a class's assignments. */
export async function assignmentIdsOf(classId: string, transaction?: Transaction) {
	const rows = await getDb().query<{ id: string }>(
		'SELECT id FROM assignments WHERE class_id = :classId',
		{ replacements: { classId }, type: QueryTypes.SELECT, transaction }
	);
	return rows.map((r) => r.id);
}

/** A date as ISO text (raw queries give strings on SQLite, Dates on PostgreSQL). */
export function isoOrNull(value: unknown): string | null {
	if (value === null || value === undefined) return null;
	const date = value instanceof Date ? value : new Date(String(value));
	return Number.isNaN(date.getTime()) ? null : date.toISOString();
}

/** SQL numbers come back as strings on PostgreSQL (COUNT, SUM): read them as numbers. */
export function num(value: unknown): number {
	if (value === null || value === undefined) return 0;
	const n = typeof value === 'number' ? value : Number(value);
	return Number.isFinite(n) ? n : 0;
}
