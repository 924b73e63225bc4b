import { randomInt } from 'node:crypto';
import { QueryTypes, UniqueConstraintError } from 'sequelize';
import { createToken } from '../auth/tokens';
import { getConfig } from '../config';
import { getDb } from '../db/index';
import { ClassGroup } from '../db/models/index';
import {
	assignmentIdsOf,
	canTeach,
	classNotFound,
	forbidden,
	invalid,
	isoOrNull,
	num,
	ownClass,
	visibleClass,
	type Actor,
	type Result
} from './common';
import { MAX_CLASS_NAME } from '../../forms/classes';

/**
 * Classes: a teacher creates, renames and archives them, and turns the join code and the invite
 * link off or renews them. A learner sees the classes they belong to (never a code or link).
 */

export interface ClassView {
	id: string;
	name: string;
	/** How the actor relates to the class. */
	as: 'teacher' | 'learner';
	teacher: { id: string; name: string };
	/** The short code learners type to join; null when turned off, and always for learners. */
	code: string | null;
	/** The invite link; null when turned off, and always for learners. */
	link: string | null;
	archived: boolean;
	archivedAt: string | null;
	memberCount: number;
	assignmentCount: number;
	createdAt: string;
}

export { MAX_CLASS_NAME };
// No 0/O, 1/I/L: a code read aloud or copied from a whiteboard comes out right.
const CODE_ALPHABET = 'ABCDEFGHJKMNPQRSTUVWXYZ23456789';
export const CODE_LENGTH = 8;

/** A fresh join code. @example newJoinCode() // 'K7MQX4PA' */
export function newJoinCode(): string {
	let code = '';
	for (let i = 0; i < CODE_LENGTH; i++) code += CODE_ALPHABET[randomInt(CODE_ALPHABET.length)];
	return code;
}

/**
 * A typed code as stored: upper case, spaces and dashes dropped; null when it cannot be one.
 * @example normalizeJoinCode(' k7mq-x4pa ') // 'K7MQX4PA'
 */
export function normalizeJoinCode(value: unknown): string | null {
	if (typeof value !== 'string') return null;
	const code = value.replace(/[\s-]/g, '').toUpperCase();
	return code.length === CODE_LENGTH && [...code].every((c) => CODE_ALPHABET.includes(c))
		? code
		: null;
}

/** The invite link for a join token. */
export function joinLinkFor(token: string): string {
	return `${getConfig().baseUrl}/join?link=${encodeURIComponent(token)}`;
}

function readClassName(value: unknown): string | null {
	if (typeof value !== 'string') return null;
	const name = value.trim().replace(/\s+/g, ' ');
	// eslint-disable-next-line no-control-regex
	if (!name || name.length > MAX_CLASS_NAME || /[\u0000-\u001f\u007f]/.test(name)) return null;
	return name;
}

const nameMessage = `Name the class in 1 to ${MAX_CLASS_NAME} characters.`;

interface ClassRow {
	id: string;
	name: string;
	teacher_id: string;
	teacher_name: string;
	join_code: string | null;
	join_token: string | null;
	archived_at: unknown;
	created_at: unknown;
	member_count: unknown;
	assignment_count: unknown;
}

const classSelect = `
	SELECT c.id, c.name, c.teacher_id, u.name AS teacher_name, c.join_code, c.join_token,
	       c.archived_at, c.created_at,
	       (SELECT COUNT(*) FROM class_members m WHERE m.class_id = c.id) AS member_count,
	       (SELECT COUNT(*) FROM assignments a WHERE a.class_id = c.id) AS assignment_count
	  FROM classes c JOIN users u ON u.id = c.teacher_id`;

function toView(row: ClassRow, actorId: string): ClassView {
	const as = row.teacher_id === actorId ? 'teacher' : 'learner';
	return {
		id: row.id,
		name: row.name,
		as,
		teacher: { id: row.teacher_id, name: row.teacher_name },
		code: as === 'teacher' ? row.join_code : null,
		link: as === 'teacher' && row.join_token ? joinLinkFor(row.join_token) : null,
		archived: row.archived_at !== null,
		archivedAt: isoOrNull(row.archived_at),
		memberCount: num(row.member_count),
		assignmentCount: num(row.assignment_count),
		createdAt: isoOrNull(row.created_at) ?? ''
	};
}

async function viewOf(classId: string, actorId: string): Promise<ClassView> {
	const [row] = await getDb().query<ClassRow>(`${classSelect} WHERE c.id = :classId`, {
		replacements: { classId },
		type: QueryTypes.SELECT
	});
	return toView(row, actorId);
}

/** Try `write` with fresh codes until the unique index accepts one (collisions are rare). */
async function withFreshCode<T>(write: (code: string) => Promise<T>): Promise<T> {
	for (let attempt = 0; ; attempt++) {
		try {
			return await write(newJoinCode());
		} catch (error) {
			if (!(error instanceof UniqueConstraintError) || attempt >= 5) throw error;
		}
	}
}

/**
 * Create a class with a join code and an invite link, both on.
 * @example await createClass(teacher, { name: 'Tuesday combo' }) // { ok: true, class: { name: 'Tuesday combo', code: 'K7MQX4PA', … } }
 */
export async function createClass(
	actor: Actor,
	input: { name?: unknown }
): Promise<Result<{ class: ClassView }>> {
	if (!canTeach(actor)) return forbidden('Only teachers create classes.');
	const name = readClassName(input.name);
	if (!name) return invalid('name', nameMessage);
	const row = await withFreshCode((joinCode) =>
		ClassGroup.create({ teacherId: actor.id, name, joinCode, joinToken: createToken() })
	);
	return { ok: true, class: await viewOf(row.id, actor.id) };
}

/**
 * The actor's classes: those they teach (newest first), then those they belong to.
 * @example await listClasses(learner) // { items: [{ name: 'Tuesday combo', as: 'learner', code: null, … }], total: 1 }
 */
export async function listClasses(
	actor: Actor,
	options: { archived?: boolean } = {}
): Promise<{ items: ClassView[]; total: number }> {
	const archivedFilter = options.archived ? '' : 'AND c.archived_at IS NULL';
	const rows = await getDb().query<ClassRow>(
		`${classSelect}
		 WHERE (c.teacher_id = :actorId ${canTeach(actor) ? '' : 'AND 1 = 0'}
		        OR EXISTS (SELECT 1 FROM class_members m
		                    WHERE m.class_id = c.id AND m.user_id = :actorId))
		   ${archivedFilter}
		 ORDER BY CASE WHEN c.teacher_id = :actorId THEN 0 ELSE 1 END, c.created_at DESC, c.id`,
		{ replacements: { actorId: actor.id }, type: QueryTypes.SELECT }
	);
	const items = rows.map((row) => toView(row, actor.id));
	return { items, total: items.length };
}

/**
 * One class as the actor may see it: their own (as teacher) or one they belong to (as learner).
 * @example await getClass(otherTeacher, classId) // { ok: false, reason: 'not-found', … }
 */
export async function getClass(
	actor: Actor,
	classId: unknown
): Promise<Result<{ class: ClassView }>> {
	const visible = await visibleClass(actor, classId);
	if (!visible) return classNotFound;
	return { ok: true, class: await viewOf(visible.row.id, actor.id) };
}

export interface ClassChange {
	name?: unknown;
	/** true archives (assignments pause, code and link stop working), false brings it back. */
	archived?: unknown;
	/** 'renew' makes a new code (turning it on), 'off' turns it off. */
	joinCode?: unknown;
	/** 'renew' makes a new link (turning it on), 'off' turns it off. */
	joinLink?: unknown;
}

/**
 * Rename, archive or restore a class, and switch or renew its code and link. All fields are
 * checked before anything is written.
 * @example await updateClass(teacher, classId, { joinCode: 'renew' }) // { ok: true, class: { code: 'Q2W…' } }
 */
export async function updateClass(
	actor: Actor,
	classId: unknown,
	change: ClassChange
): Promise<Result<{ class: ClassView }>> {
	const row = await ownClass(actor, classId);
	if (!row) return classNotFound;
	let name: string | undefined;
	if (change.name !== undefined) {
		const read = readClassName(change.name);
		if (!read) return invalid('name', nameMessage);
		name = read;
	}
	if (change.archived !== undefined && typeof change.archived !== 'boolean') {
		return invalid('archived', 'Send archived as true or false.');
	}
	for (const field of ['joinCode', 'joinLink'] as const) {
		const value = change[field];
		if (value !== undefined && value !== 'renew' && value !== 'off') {
			return invalid(field, `Send ${field} as "renew" or "off".`);
		}
	}
	const now = new Date();
	await withFreshCode(async (freshCode) => {
		await getDb().transaction(async (transaction) => {
			if (name !== undefined) row.name = name;
			if (change.joinCode === 'renew') row.joinCode = freshCode;
			if (change.joinCode === 'off') row.joinCode = null;
			if (change.joinLink === 'renew') row.joinToken = createToken();
			if (change.joinLink === 'off') row.joinToken = null;
			if (change.archived === true && !row.archivedAt) {
				row.archivedAt = now;
				// An archived class brings no new licks: its assignments pause (history stays).
				const ids = await assignmentIdsOf(row.id, transaction);
				if (ids.length) {
					await getDb().query(
						'UPDATE assignments SET paused_at = :now, updated_at = :now WHERE class_id = :classId AND paused_at IS NULL',
						{ replacements: { now, classId: row.id }, transaction }
					);
				}
			}
			if (change.archived === false) row.archivedAt = null;
			await row.save({ transaction });
		});
	});
	return { ok: true, class: await viewOf(row.id, actor.id) };
}

/**
 * Archive a class (the DELETE of the API): nothing is deleted, so learners keep their history;
 * its assignments pause and joining stops. Restore with `updateClass(…, { archived: false })`.
 */
export async function archiveClass(
	actor: Actor,
	classId: unknown
): Promise<Result<{ class: ClassView }>> {
	return updateClass(actor, classId, { archived: true });
}
