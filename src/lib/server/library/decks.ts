import { Op, type Transaction } from 'sequelize';
import { getDb } from '../db/index';
import { followDeckEdit } from '../classes/class-cards';
import { Assignment, Deck, DeckLick, Lick, User } from '../db/models/index';
import { readableDeck, readableLick, readableLickSql, type Actor } from './access';
import { deckNotFound, LibraryError } from './errors';
import { isUuid, listLicks, MAX_PAGE, type LickSummary } from './licks';

/**
 * Decks: a person's named, ordered lists of licks. The owner changes a deck; members of a class
 * it is assigned to may read it. A deck holds licks its owner may read (their own, their
 * classes', public ones); deleting a deck keeps the licks.
 */

export const DECK_LIMITS = { name: 120, description: 2000, licks: 500 } as const;

export interface DeckSummary {
	id: string;
	name: string;
	description: string;
	lickCount: number;
	owner: { id: string; name: string };
	mine: boolean;
	updatedAt: string;
}

export interface DeckDetail extends DeckSummary {
	/** The deck's licks in order (those the actor may read). */
	licks: LickSummary[];
}

export interface DeckInput {
	name?: string;
	description?: string;
	/** The deck's licks, in order; replaces the whole list. */
	lickIds?: string[];
}

const bad = (message: string, field?: string) =>
	new LibraryError(400, message, field ? { field } : {});
const invalid = (message: string, field?: string) =>
	new LibraryError(422, message, field ? { field } : {});

/**
 * Check a deck body's fields and types; throws a `LibraryError` naming the field.
 * @example readDeckInput({ name: 'Turnarounds', lickIds: [] }) // { name: 'Turnarounds', lickIds: [] }
 */
export function readDeckInput(body: unknown): DeckInput {
	if (!body || typeof body !== 'object' || Array.isArray(body)) {
		throw bad('The body must be a JSON object such as {"name": "Turnarounds"}.');
	}
	const value = body as Record<string, unknown>;
	const unknown = Object.keys(value).filter((k) => !['name', 'description', 'lickIds'].includes(k));
	if (unknown.length) {
		throw bad(
			`Unknown field ${unknown.map((k) => `“${k}”`).join(', ')}: send name, description or lickIds.`,
			unknown[0]
		);
	}
	const input: DeckInput = {};
	if (value.name !== undefined) {
		if (typeof value.name !== 'string') throw bad('“name” must be a string.', 'name');
		const name = value.name.trim();
		if (!name) throw invalid('Give the deck a name.', 'name');
		if (name.length > DECK_LIMITS.name)
			throw invalid(`A deck name has at most ${DECK_LIMITS.name} characters.`, 'name');
		input.name = name;
	}
	if (value.description !== undefined) {
		if (typeof value.description !== 'string')
			throw bad('“description” must be a string.', 'description');
		if (value.description.length > DECK_LIMITS.description) {
			throw invalid(
				`A description has at most ${DECK_LIMITS.description} characters.`,
				'description'
			);
		}
		input.description = value.description.trim();
	}
	if (value.lickIds !== undefined) {
		const ids = value.lickIds;
		if (!Array.isArray(ids) || ids.some((id) => typeof id !== 'string')) {
			throw bad('“lickIds” must be a list of lick ids, in order.', 'lickIds');
		}
		if (ids.length > DECK_LIMITS.licks)
			throw invalid(`A deck holds at most ${DECK_LIMITS.licks} licks.`, 'lickIds');
		if (new Set(ids).size !== ids.length)
			throw invalid('A lick appears in a deck once.', 'lickIds');
		input.lickIds = ids as string[];
	}
	return input;
}

type DeckRow = Deck & { User?: User };

async function countsOf(ids: string[]): Promise<Map<string, number>> {
	const out = new Map<string, number>();
	if (!ids.length) return out;
	const rows = (await DeckLick.findAll({
		where: { deckId: ids },
		attributes: ['deckId', [getDb().fn('COUNT', getDb().col('id')), 'n']],
		group: ['deckId'],
		raw: true
	})) as unknown as { deckId: string; n: number | string }[];
	for (const r of rows) out.set(r.deckId, Number(r.n));
	return out;
}

function toSummary(actor: Actor, row: DeckRow, count: number): DeckSummary {
	return {
		id: row.id,
		name: row.name,
		description: row.description,
		lickCount: count,
		owner: { id: row.ownerId, name: row.User?.name ?? '' },
		mine: row.ownerId === actor.id,
		updatedAt: new Date(row.updatedAt).toISOString()
	};
}

async function findReadable(actor: Actor, id: string, transaction?: Transaction): Promise<DeckRow> {
	if (!isUuid(id)) throw deckNotFound();
	const row = (await Deck.findOne({
		where: { [Op.and]: [{ id }, readableDeck(actor)] },
		include: [{ model: User, attributes: ['id', 'name'] }],
		transaction
	})) as DeckRow | null;
	if (!row) throw deckNotFound();
	return row;
}

async function findOwn(actor: Actor, id: string, transaction?: Transaction): Promise<DeckRow> {
	const row = await findReadable(actor, id, transaction);
	if (row.ownerId !== actor.id) throw new LibraryError(403, 'Only its owner can change this deck.');
	return row;
}

/**
 * The decks the actor may read (their own and those assigned to their classes), by name.
 * @example await listDecks(user, { q: 'turn' }) // { items: [...], total: 1 }
 */
export async function listDecks(
	actor: Actor,
	query: { q?: string; limit?: number; offset?: number } = {}
): Promise<{ items: DeckSummary[]; total: number }> {
	const db = getDb();
	const and: unknown[] = [readableDeck(actor)];
	const q = (query.q ?? '').trim().toLowerCase();
	if (q)
		and.push(
			db.where(db.fn('LOWER', db.col('Deck.name')), { [Op.like]: `%${q.replace(/[%_]/g, '_')}%` })
		);
	const where = { [Op.and]: and };
	const limit = Math.min(MAX_PAGE, Math.max(1, query.limit ?? 50));
	const offset = Math.max(0, query.offset ?? 0);
	const [total, rows] = await Promise.all([
		Deck.count({ where }),
		Deck.findAll({
			where,
			include: [{ model: User, attributes: ['id', 'name'] }],
			order: [
				['name', 'ASC'],
				['id', 'ASC']
			],
			limit,
			offset
		}) as Promise<DeckRow[]>
	]);
	const counts = await countsOf(rows.map((r) => r.id));
	return { items: rows.map((r) => toSummary(actor, r, counts.get(r.id) ?? 0)), total };
}

/**
 * The ids of a deck's licks in order, those the actor may read: for the drill and classes.
 * @example await deckLickIds(user, deckId) // ['…', '…']
 */
export async function deckLickIds(actor: Actor, deckId: string): Promise<string[]> {
	await findReadable(actor, deckId);
	const rows = await DeckLick.findAll({
		where: {
			[Op.and]: [
				{ deckId },
				getDb().literal(
					`EXISTS (SELECT 1 FROM "licks" AS rl WHERE rl."id" = "DeckLick"."lick_id" AND ${readableLickSql(actor, 'rl')})`
				)
			]
		},
		order: [['position', 'ASC']]
	});
	return rows.map((r) => r.lickId);
}

/**
 * One deck with its licks in order.
 * @example await getDeck(user, id) // { name, licks: [...] }
 */
export async function getDeck(actor: Actor, id: string): Promise<DeckDetail> {
	const row = await findReadable(actor, id);
	const ids = await deckLickIds(actor, id);
	const licks: LickSummary[] = [];
	for (let i = 0; i < ids.length; i += MAX_PAGE) {
		const page = await listLicks(actor, { scope: 'all', deckId: id, limit: MAX_PAGE, offset: i });
		licks.push(...page.items);
	}
	const byId = new Map(licks.map((l) => [l.id, l]));
	const ordered = ids.map((lid) => byId.get(lid)).filter((l): l is LickSummary => !!l);
	return { ...toSummary(actor, row, ids.length), licks: ordered };
}

/** Refuse lick ids the owner may not put in a deck (unknown, or another author's private lick). */
async function checkLicks(actor: Actor, ids: string[], transaction: Transaction): Promise<void> {
	if (!ids.length) return;
	const bad = ids.find((id) => !isUuid(id));
	if (bad) throw invalid(`No lick “${bad}” in your reach.`, 'lickIds');
	const found = await Lick.findAll({
		where: { [Op.and]: [{ id: ids }, readableLick(actor)] },
		attributes: ['id'],
		transaction
	});
	const seen = new Set(found.map((r) => r.id));
	const missing = ids.find((id) => !seen.has(id));
	if (missing) throw invalid(`No lick “${missing}” in your reach.`, 'lickIds');
}

async function writeOrder(deckId: string, ids: string[], transaction: Transaction): Promise<void> {
	await DeckLick.destroy({ where: { deckId }, transaction });
	if (ids.length) {
		await DeckLick.bulkCreate(
			ids.map((lickId, position) => ({ deckId, lickId, position })),
			{ transaction }
		);
	}
}

/**
 * A new deck of the actor's, with licks in the order given.
 * @example await createDeck(user, { name: 'Turnarounds', lickIds: [a, b] }) // { id, … }
 */
export async function createDeck(actor: Actor, input: DeckInput): Promise<DeckDetail> {
	if (!input.name) throw invalid('Give the deck a name.', 'name');
	const id = await getDb().transaction(async (transaction) => {
		await checkLicks(actor, input.lickIds ?? [], transaction);
		const deck = await Deck.create(
			{ ownerId: actor.id, name: input.name!, description: input.description ?? '' },
			{ transaction }
		);
		await writeOrder(deck.id, input.lickIds ?? [], transaction);
		return deck.id;
	});
	return getDeck(actor, id);
}

/**
 * Rename, describe or reorder the actor's own deck (`lickIds` replaces the list and its order).
 * Licks new to a deck that is assigned to classes become cards of the classes' members; licks
 * taken out retire the members' still-new cards of them; new cards follow the new order.
 * @example await updateDeck(user, id, { lickIds: [b, a] })
 */
export async function updateDeck(
	actor: Actor,
	id: string,
	input: DeckInput,
	now = new Date()
): Promise<DeckDetail> {
	await getDb().transaction(async (transaction) => {
		const row = await findOwn(actor, id, transaction);
		if (input.lickIds) {
			await checkLicks(actor, input.lickIds, transaction);
			const before = await DeckLick.findAll({
				where: { deckId: row.id },
				attributes: ['lickId'],
				transaction
			});
			const had = new Set(before.map((r) => r.lickId));
			await writeOrder(row.id, input.lickIds, transaction);
			// A class the deck is assigned to gets the new licks now, not at its next join or edit;
			// licks taken out stop coming as new, and new cards follow the deck's order.
			const added = input.lickIds.filter((lickId) => !had.has(lickId));
			const kept = new Set(input.lickIds);
			const removed = [...had].filter((lickId) => !kept.has(lickId));
			await followDeckEdit(row.id, input.lickIds, { added, removed }, now, transaction);
		}
		const changes: Partial<{ name: string; description: string }> = {};
		if (input.name !== undefined) changes.name = input.name;
		if (input.description !== undefined) changes.description = input.description;
		// updatedAt moves on a reorder too, so "recently changed" lists see it.
		row.set(changes);
		row.changed('updatedAt', true);
		await row.save({ transaction });
	});
	return getDeck(actor, id);
}

/**
 * Delete the actor's own deck; its licks stay in the library.
 * @example await deleteDeck(user, id)
 */
export async function deleteDeck(actor: Actor, id: string): Promise<void> {
	await getDb().transaction(async (transaction) => {
		const row = await findOwn(actor, id, transaction);
		// A class's assignment is built on the deck: deleting it would end the assignment and
		// orphan the learners' cards, so that is the classes screen's decision, not this one's.
		if ((await Assignment.count({ where: { deckId: row.id }, transaction })) > 0) {
			throw new LibraryError(
				409,
				'This deck is assigned to a class: end the assignment before deleting the deck.'
			);
		}
		await DeckLick.destroy({ where: { deckId: row.id }, transaction });
		await Deck.destroy({ where: { id: row.id, ownerId: actor.id }, transaction });
	});
}
