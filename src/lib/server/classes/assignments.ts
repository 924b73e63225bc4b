import { QueryTypes } from 'sequelize';
import { NEW_PER_DAY_MAX, TEMPO_MAX, TEMPO_MIN } from '../../forms/classes';
import { QUALITY_IDS } from '../../music/types';
import { addDays } from '../../practice/day';
import { getDb } from '../db/index';
import { Assignment, ClassMember, Deck } from '../db/models/index';
import { createAssignmentCards, retireDroppedQualities, retireNewCards } from './class-cards';
import {
	canTeach,
	classNotFound,
	conflict,
	invalid,
	isId,
	isoOrNull,
	notFound,
	num,
	ownClass,
	visibleClass,
	type Actor,
	type Result
} from './common';
import { normalizeKey } from './keys';

/**
 * Assignments: a deck given to a class at a pace. Creating one makes every member's cards (the
 * drill introduces them `newPerDay` a day from `startDate`); members who join later get theirs
 * when they join. Removing one retires its still-new cards and keeps everything practised.
 */

export interface AssignmentView {
	id: string;
	classId: string;
	deckId: string;
	deckName: string;
	/** Licks in the deck now. */
	lickCount: number;
	startDate: string;
	endDate: string | null;
	newPerDay: number;
	/** Key tonics drilled; null means all twelve. */
	keys: string[] | null;
	/** Qualities drilled besides each lick's home one. */
	qualities: string[];
	targetTempo: number | null;
	paused: boolean;
	pausedAt: string | null;
	createdAt: string;
}

export interface AssignmentInput {
	deckId?: unknown;
	startDate?: unknown;
	newPerDay?: unknown;
	keys?: unknown;
	qualities?: unknown;
	targetTempo?: unknown;
	endDate?: unknown;
	/** Only on edits: true pauses, false resumes. */
	paused?: unknown;
}

export { NEW_PER_DAY_MAX, TEMPO_MAX, TEMPO_MIN };

const dayPattern = /^\d{4}-\d{2}-\d{2}$/;

/** A real calendar day 'YYYY-MM-DD' (not 2026-02-30). */
export function isDay(value: unknown): value is string {
	return typeof value === 'string' && dayPattern.test(value) && addDays(value, 0) === value;
}

type Read<T> = { ok: true; value: T } | { ok: false; field: string; message: string };
type Reader<T> = (value: unknown) => Read<T>;
const ok = <T>(value: T): Read<T> => ({ ok: true, value });
const bad = (field: string, message: string) => ({ ok: false as const, field, message });

/** Key tonics: absent or null for all twelve, else 1–12 distinct keys. */
export function readKeys(value: unknown): Read<string[] | null> {
	if (value === undefined || value === null) return ok(null);
	if (!Array.isArray(value) || value.length === 0 || value.length > 12) {
		return bad(
			'keys',
			'Send keys as a list of 1 to 12 key tonics such as ["C", "Eb"], or leave it out for all twelve.'
		);
	}
	const keys: string[] = [];
	for (const item of value) {
		const key = normalizeKey(item);
		if (!key)
			return bad(
				'keys',
				`${JSON.stringify(item)} is not a key tonic; use names such as C, F#, Bb.`
			);
		if (keys.includes(key)) return bad('keys', `${key} is listed twice.`);
		keys.push(key);
	}
	// All twelve is stored as null, the contract's "all twelve".
	return ok(keys.length === 12 ? null : keys);
}

export function readQualities(value: unknown): Read<string[]> {
	if (value === undefined || value === null) return ok([]);
	if (!Array.isArray(value) || value.length > QUALITY_IDS.length) {
		return bad('qualities', `Send qualities as a list drawn from ${QUALITY_IDS.join(' ')}.`);
	}
	const out: string[] = [];
	for (const item of value) {
		if (typeof item !== 'string' || !(QUALITY_IDS as readonly string[]).includes(item)) {
			return bad(
				'qualities',
				`${JSON.stringify(item)} is not a chord quality; use one of ${QUALITY_IDS.join(' ')}.`
			);
		}
		if (!out.includes(item)) out.push(item);
	}
	return ok(out);
}

/** A calendar day, refused with `message` under `field`. */
const readDay =
	(field: string, message: string): Reader<string> =>
	(value) =>
		isDay(value) ? ok(value) : bad(field, message);

/** A whole number from `min` to `max` (a form's digits count as one), named `what` when refused. */
const readInt =
	(field: string, min: number, max: number, what: string): Reader<number> =>
	(value) => {
		const n = typeof value === 'string' && /^\d+$/.test(value.trim()) ? Number(value) : value;
		if (typeof n !== 'number' || !Number.isInteger(n) || n < min || n > max) {
			return bad(field, `${what} must be a whole number from ${min} to ${max}.`);
		}
		return ok(n);
	};

/** An optional field: absent, null or empty means none, anything else goes through `read`. */
const orNone =
	<T>(read: Reader<T>): Reader<T | null> =>
	(value) =>
		value === undefined || value === null || value === '' ? ok(null) : read(value);

interface Checked {
	startDate: string;
	endDate: string | null;
	newPerDay: number;
	keys: string[] | null;
	qualities: string[];
	targetTempo: number | null;
}

/** How each field of an assignment is read, in the order its refusals come. */
const assignmentReaders: { [K in keyof Checked]: Reader<Checked[K]> } = {
	startDate: readDay('startDate', 'Give the start date as YYYY-MM-DD.'),
	endDate: orNone(readDay('endDate', 'Give the end date as YYYY-MM-DD, or leave it out.')),
	newPerDay: readInt('newPerDay', 1, NEW_PER_DAY_MAX, 'New licks a day'),
	keys: readKeys,
	qualities: readQualities,
	targetTempo: orNone(readInt('targetTempo', TEMPO_MIN, TEMPO_MAX, 'The target tempo'))
};

/**
 * Check every field of an assignment: a full one, or an edit over `base` (a field not sent keeps
 * its stored value; one a creation must have is refused when missing).
 */
function readAssignment(input: AssignmentInput, base?: Checked): Read<Checked> {
	const checked: Partial<Record<keyof Checked, unknown>> = {};
	for (const name of Object.keys(assignmentReaders) as (keyof Checked)[]) {
		if (input[name] === undefined && base) {
			checked[name] = base[name];
			continue;
		}
		const read = assignmentReaders[name](input[name]);
		if (!read.ok) return read;
		checked[name] = read.value;
	}
	const value = checked as Checked;
	if (value.endDate !== null && value.endDate < value.startDate) {
		return bad('endDate', 'The end date comes before the start date.');
	}
	return ok(value);
}

interface AssignmentRow {
	id: string;
	class_id: string;
	deck_id: string;
	deck_name: string;
	lick_count: unknown;
	start_date: string;
	end_date: string | null;
	new_per_day: unknown;
	keys: string | null;
	qualities: string | null;
	target_tempo: unknown;
	paused_at: unknown;
	created_at: unknown;
}

function parseList(text: string | null): string[] | null {
	if (text === null) return null;
	try {
		const value = JSON.parse(text) as unknown;
		return Array.isArray(value) ? value.map(String) : null;
	} catch {
		return null;
	}
}

function toView(row: AssignmentRow): AssignmentView {
	return {
		id: row.id,
		classId: row.class_id,
		deckId: row.deck_id,
		deckName: row.deck_name,
		lickCount: num(row.lick_count),
		startDate: row.start_date,
		endDate: row.end_date,
		newPerDay: num(row.new_per_day),
		keys: parseList(row.keys),
		qualities: parseList(row.qualities) ?? [],
		targetTempo: row.target_tempo === null ? null : num(row.target_tempo),
		paused: row.paused_at !== null,
		pausedAt: isoOrNull(row.paused_at),
		createdAt: isoOrNull(row.created_at) ?? ''
	};
}

/** SQL counting the licks of the deck whose id is `deckId` (a column). */
const lickCountOf = (deckId: string) =>
	`(SELECT COUNT(*) FROM deck_licks dl WHERE dl.deck_id = ${deckId})`;

/** The columns an `AssignmentRow` is read from (assignment `a`, its deck `d`). */
const assignmentColumns = `a.id, a.class_id, a.deck_id, d.name AS deck_name, a.start_date, a.end_date,
	       a.new_per_day, a.keys, a.qualities, a.target_tempo, a.paused_at, a.created_at,
	       ${lickCountOf('a.deck_id')} AS lick_count`;

const assignmentSelect = `
	SELECT ${assignmentColumns}
	  FROM assignments a JOIN decks d ON d.id = a.deck_id`;

async function viewOf(id: string): Promise<AssignmentView> {
	const [row] = await getDb().query<AssignmentRow>(`${assignmentSelect} WHERE a.id = :id`, {
		replacements: { id },
		type: QueryTypes.SELECT
	});
	return toView(row);
}

const assignmentNotFound = notFound('No such assignment in your classes.');

/**
 * A class's assignments, oldest first: for its teacher and for its members.
 * @example await listAssignments(learner, classId) // { ok: true, items: [{ deckName: 'First steps…', newPerDay: 4, … }], total: 1 }
 */
export async function listAssignments(
	actor: Actor,
	classId: unknown
): Promise<Result<{ items: AssignmentView[]; total: number }>> {
	const visible = await visibleClass(actor, classId);
	if (!visible) return classNotFound;
	const rows = await getDb().query<AssignmentRow>(
		`${assignmentSelect} WHERE a.class_id = :classId ORDER BY a.created_at, a.id`,
		{ replacements: { classId: visible.row.id }, type: QueryTypes.SELECT }
	);
	const items = rows.map(toView);
	return { ok: true, items, total: items.length };
}

/**
 * Assign one of the teacher's decks to their class, and make every member's cards for it.
 * @example await createAssignment(teacher, classId, { deckId, startDate: '2026-03-02', newPerDay: 4, keys: ['C', 'F', 'Bb', 'Eb', 'Ab', 'Db'] })
 */
export async function createAssignment(
	actor: Actor,
	classId: unknown,
	input: AssignmentInput,
	now = new Date()
): Promise<Result<{ assignment: AssignmentView }>> {
	const cls = await ownClass(actor, classId);
	if (!cls) return classNotFound;
	if (cls.archivedAt) return conflict('This class is archived; restore it before assigning decks.');
	if (!isId(input.deckId)) return invalid('deckId', 'Choose one of your decks.');
	const deck = await Deck.findOne({ where: { id: input.deckId, ownerId: actor.id } });
	if (!deck) return invalid('deckId', 'Choose one of your decks.');
	const read = readAssignment(input);
	if (!read.ok) return invalid(read.field, read.message);
	const id = await getDb().transaction(async (transaction) => {
		const row = await Assignment.create(
			{ classId: cls.id, deckId: deck.id, ...read.value, pausedAt: null },
			{ transaction }
		);
		const members = await ClassMember.findAll({ where: { classId: cls.id }, transaction });
		await createAssignmentCards(
			{ id: row.id, deckId: deck.id, qualities: read.value.qualities },
			members.map((m) => m.userId),
			now,
			transaction
		);
		return row.id;
	});
	return { ok: true, assignment: await viewOf(id) };
}

/** The assignment if the actor teaches its class. */
async function ownAssignment(actor: Actor, id: unknown): Promise<Assignment | null> {
	if (!isId(id) || !canTeach(actor)) return null;
	const row = await Assignment.findByPk(id);
	if (!row) return null;
	return (await ownClass(actor, row.classId)) ? row : null;
}

/**
 * Edit an assignment: any field of its creation (the deck stays), and `paused`. New qualities
 * make cards; dropped ones retire their still-new cards.
 * @example await updateAssignment(teacher, id, { paused: true }) // { ok: true, assignment: { paused: true, … } }
 */
export async function updateAssignment(
	actor: Actor,
	id: unknown,
	input: AssignmentInput,
	now = new Date()
): Promise<Result<{ assignment: AssignmentView }>> {
	const row = await ownAssignment(actor, id);
	if (!row) return assignmentNotFound;
	if (input.deckId !== undefined && input.deckId !== row.deckId) {
		return invalid(
			'deckId',
			'The deck of an assignment cannot change; remove it and assign the other deck.'
		);
	}
	if (input.paused !== undefined && typeof input.paused !== 'boolean') {
		return invalid('paused', 'Send paused as true or false.');
	}
	const read = readAssignment(input, {
		startDate: row.startDate,
		endDate: row.endDate ?? null,
		newPerDay: row.newPerDay,
		keys: row.keys ?? null,
		qualities: row.qualities ?? [],
		targetTempo: row.targetTempo ?? null
	});
	if (!read.ok) return invalid(read.field, read.message);
	await getDb().transaction(async (transaction) => {
		const qualitiesChanged = JSON.stringify(read.value.qualities) !== JSON.stringify(row.qualities);
		Object.assign(row, read.value);
		if (input.paused === true && !row.pausedAt) row.pausedAt = now;
		if (input.paused === false) row.pausedAt = null;
		await row.save({ transaction });
		if (qualitiesChanged) {
			const members = await ClassMember.findAll({ where: { classId: row.classId }, transaction });
			await createAssignmentCards(
				{ id: row.id, deckId: row.deckId, qualities: read.value.qualities },
				members.map((m) => m.userId),
				now,
				transaction
			);
			await retireDroppedQualities(row.id, read.value.qualities, now, transaction);
		}
	});
	return { ok: true, assignment: await viewOf(row.id) };
}

/**
 * Remove an assignment: its still-new cards retire first (so they stay out of the drill even
 * once the link to the assignment is gone); practised cards and reviews stay with the learners.
 * @example await deleteAssignment(teacher, id) // { ok: true, retired: 12 }
 */
export async function deleteAssignment(
	actor: Actor,
	id: unknown,
	now = new Date()
): Promise<Result<{ retired: number }>> {
	const row = await ownAssignment(actor, id);
	if (!row) return assignmentNotFound;
	const retired = await getDb().transaction(async (transaction) => {
		const count = await retireNewCards([row.id], null, now, transaction);
		await row.destroy({ transaction });
		return count;
	});
	return { ok: true, retired };
}

export interface AssignedDeck {
	assignmentId: string;
	deckId: string;
	deckName: string;
	lickCount: number;
	classId: string;
	className: string;
	teacherName: string;
	startDate: string;
	endDate: string | null;
	newPerDay: number;
	keys: string[] | null;
	qualities: string[];
	targetTempo: number | null;
	paused: boolean;
}

/**
 * The decks assigned to a learner through the classes they belong to (for their library).
 * @example await decksAssignedTo(learner.id) // [{ deckName: 'First steps…', className: 'Tuesday combo', teacherName: 'Rosa…', … }]
 */
export async function decksAssignedTo(userId: string): Promise<AssignedDeck[]> {
	const rows = await getDb().query<AssignmentRow & { class_name: string; teacher_name: string }>(
		`SELECT ${assignmentColumns}, c.name AS class_name, u.name AS teacher_name
		   FROM class_members m
		   JOIN classes c ON c.id = m.class_id
		   JOIN users u ON u.id = c.teacher_id
		   JOIN assignments a ON a.class_id = c.id
		   JOIN decks d ON d.id = a.deck_id
		  WHERE m.user_id = :userId AND c.archived_at IS NULL
		  ORDER BY c.name, a.created_at, a.id`,
		{ replacements: { userId }, type: QueryTypes.SELECT }
	);
	return rows.map((row) => {
		// A learner sees the plan, not when it was made or paused.
		const { id, pausedAt: _pausedAt, createdAt: _createdAt, ...view } = toView(row);
		return { assignmentId: id, ...view, className: row.class_name, teacherName: row.teacher_name };
	});
}

/**
 * Whether a learner may open a deck because it is assigned to a class they belong to (the
 * library's read check for decks that are not the learner's own).
 */
export async function isDeckAssignedTo(userId: string, deckId: unknown): Promise<boolean> {
	if (!isId(deckId)) return false;
	const [row] = await getDb().query<{ n: unknown }>(
		`SELECT COUNT(*) AS n FROM class_members m JOIN assignments a ON a.class_id = m.class_id
		  WHERE m.user_id = :userId AND a.deck_id = :deckId`,
		{ replacements: { userId, deckId }, type: QueryTypes.SELECT }
	);
	return num(row?.n) > 0;
}

/** The actor's own decks, the ones they may assign, by name. */
export async function assignableDecks(
	actor: Actor
): Promise<{ id: string; name: string; lickCount: number }[]> {
	if (!canTeach(actor)) return [];
	const rows = await getDb().query<{ id: string; name: string; lick_count: unknown }>(
		`SELECT d.id, d.name, ${lickCountOf('d.id')} AS lick_count
		   FROM decks d WHERE d.owner_id = :ownerId ORDER BY d.name, d.id`,
		{ replacements: { ownerId: actor.id }, type: QueryTypes.SELECT }
	);
	return rows.map((r) => ({ id: r.id, name: r.name, lickCount: num(r.lick_count) }));
}
