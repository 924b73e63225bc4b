/**
 * Cards: what a learner remembers, one per learner, lick and chord quality. A learner adds cards
 * from their own licks and decks, from decks their classes are assigned, and from licks they may
 * see (public ones; a teacher's class licks when they are in that teacher's class). A card and
 * its history are seen by its learner and that learner's teachers only. Every function takes the
 * acting user first and checks ownership inside.
 */
import { Op, QueryTypes, type Transaction } from 'sequelize';
import { getDb } from '../db/index';
import {
	Assignment,
	Card,
	ClassGroup,
	ClassMember,
	Deck,
	DeckLick,
	Lick,
	Review
} from '../db/models/index';
import { isQualityId } from '../../music/qualities';
import type { AddCardsAnswer, CardAnswer, ReviewRecord } from '../../practice/api';
import { retrievability, stateName } from '../../practice/scheduler';
import { cardStateOf, schedulingOf } from './state';
import { loadLearner, type Actor } from './learner';

/** A refusal a route turns into its status and sentence. */
export class StudyError extends Error {
	constructor(
		readonly status: 400 | 404 | 409 | 422 | 503,
		message: string,
		readonly field?: string,
		/** For a 503: when to try again. */
		readonly retryAfterSeconds?: number
	) {
		super(message);
		this.name = 'StudyError';
	}
}

/** Ids of the teachers of the classes `learnerId` is a member of (archived classes too). */
export async function teachersOf(
	learnerId: string,
	transaction?: Transaction
): Promise<Set<string>> {
	const rows = await getDb().query<{ teacher_id: string }>(
		`SELECT DISTINCT c.teacher_id FROM class_members m JOIN classes c ON c.id = m.class_id
		 WHERE m.user_id = :learnerId`,
		{ replacements: { learnerId }, type: QueryTypes.SELECT, transaction }
	);
	return new Set(rows.map((r) => r.teacher_id));
}

/** Can `actorId` use the lick (see it and drill it)? */
async function canUseLick(actorId: string, lick: Lick): Promise<boolean> {
	if (lick.authorId === actorId || lick.visibility === 'public') return true;
	if (lick.visibility === 'classes') return (await teachersOf(actorId)).has(lick.authorId);
	return false;
}

/** Can `actorId` drill a deck: their own, or one assigned to a class they are in? */
async function canUseDeck(actorId: string, deck: Deck): Promise<boolean> {
	if (deck.ownerId === actorId) return true;
	const assigned = await Assignment.findOne({
		where: { deckId: deck.id },
		include: [
			{
				model: ClassGroup,
				required: true,
				include: [{ model: ClassMember, required: true, where: { userId: actorId } }]
			}
		]
	});
	return assigned !== null;
}

export type AddCardsInput = { lickId: string; qualities?: string[] } | { deckId: string };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Is this a well-formed id (anything else cannot name a row, so it is a 404 at once)? */
export function isId(value: unknown): value is string {
	return typeof value === 'string' && UUID.test(value);
}

/**
 * Add cards to the actor's drill: one lick over its home quality plus chosen qualities, or every
 * lick of a deck over its home quality. Cards already there are left as they are
 * (insert-or-ignore on the unique learner, lick and quality). New cards queue after the
 * learner's other new cards and come at the learner's own pace.
 * @example await addCards(me, { lickId, qualities: ['m7'] }, now) // { created: 2, existing: 0, … }
 */
export async function addCards(
	actor: Actor,
	input: AddCardsInput,
	now: Date
): Promise<AddCardsAnswer> {
	let licks: Lick[];
	const extra: string[] = [];
	if ('deckId' in input) {
		const deck = isId(input.deckId) ? await Deck.findByPk(input.deckId) : null;
		if (!deck || !(await canUseDeck(actor.id, deck))) throw new StudyError(404, 'No such deck.');
		const rows = await DeckLick.findAll({
			where: { deckId: deck.id },
			order: [['position', 'ASC']]
		});
		const found = await Lick.findAll({ where: { id: rows.map((r) => r.lickId) } });
		const byId = new Map(found.map((l) => [l.id, l]));
		licks = [];
		for (const r of rows) {
			const lick = byId.get(r.lickId);
			// A deck the learner may use can still hold someone's private lick: leave it out.
			if (
				lick &&
				(deck.ownerId === actor.id ||
					lick.authorId === deck.ownerId ||
					(await canUseLick(actor.id, lick)))
			) {
				licks.push(lick);
			}
		}
	} else {
		const lick = isId(input.lickId) ? await Lick.findByPk(input.lickId) : null;
		if (!lick || !(await canUseLick(actor.id, lick))) throw new StudyError(404, 'No such lick.');
		for (const q of input.qualities ?? []) {
			if (!isQualityId(q)) {
				throw new StudyError(422, `“${q}” is not a chord quality.`, 'qualities');
			}
			if (!extra.includes(q)) extra.push(q);
		}
		licks = [lick];
	}
	return insertCards(actor.id, licks, extra, null, now);
}

/**
 * Insert-or-ignore cards for `userId`: each lick over its home quality and `extraQualities`.
 * Reused by the demo seed; the classes engineer's own insert follows the same rule.
 */
export async function insertCards(
	userId: string,
	licks: readonly Lick[],
	extraQualities: readonly string[],
	assignmentId: string | null,
	now: Date,
	transaction?: Transaction
): Promise<AddCardsAnswer> {
	const wanted: { lickId: string; quality: string }[] = [];
	for (const lick of licks) {
		for (const quality of [lick.homeQuality, ...extraQualities]) {
			if (!wanted.some((w) => w.lickId === lick.id && w.quality === quality)) {
				wanted.push({ lickId: lick.id, quality });
			}
		}
	}
	if (wanted.length === 0) return { created: 0, existing: 0, cardIds: [] };
	const where = { userId, lickId: { [Op.in]: [...new Set(wanted.map((w) => w.lickId))] } };
	const before = await Card.findAll({
		where,
		attributes: ['id', 'lickId', 'quality'],
		transaction
	});
	const had = new Set(before.map((c) => `${c.lickId}|${c.quality}`));
	const maxPosition =
		((await Card.max('newPosition', { where: { userId }, transaction })) as number | null) ?? 0;
	let position = maxPosition;
	const rows = wanted
		.filter((w) => !had.has(`${w.lickId}|${w.quality}`))
		.map((w) => ({
			userId,
			lickId: w.lickId,
			quality: w.quality,
			assignmentId,
			newPosition: ++position,
			due: now
		}));
	// Insert-or-ignore: a concurrent add of the same card is not an error.
	if (rows.length) await Card.bulkCreate(rows, { ignoreDuplicates: true, transaction });
	const after = await Card.findAll({ where, attributes: ['id', 'lickId', 'quality'], transaction });
	const ids = after
		.filter((c) => wanted.some((w) => w.lickId === c.lickId && w.quality === c.quality))
		.map((c) => c.id);
	const existing = wanted.filter((w) => had.has(`${w.lickId}|${w.quality}`)).length;
	return { created: ids.length - existing, existing, cardIds: ids };
}

/** A stored review as the API sends it. */
export function reviewRecordOf(r: Review): ReviewRecord {
	return {
		id: r.id,
		cardId: r.cardId,
		clientId: r.clientId,
		sittingId: r.sittingId ?? null,
		reviewedAt: new Date(r.reviewedAt).toISOString(),
		day: r.day,
		grade: r.grade as ReviewRecord['grade'],
		key: r.key,
		quality: r.quality,
		tempo: r.tempo ?? null,
		revealMs: r.revealMs ?? null,
		gradeMs: r.gradeMs ?? null,
		undoneAt: r.undoneAt ? new Date(r.undoneAt).toISOString() : null
	};
}

/**
 * A card with its review history, for its learner or one of that learner's teachers (a teacher
 * of a class the learner is a member of); anyone else gets a 404, as if it did not exist.
 * @example await getCard(me, cardId, now) // { card: { … }, reviews: [ … ] }
 */
export async function getCard(actor: Actor, cardId: string, now: Date): Promise<CardAnswer> {
	const card = isId(cardId) ? await Card.findByPk(cardId) : null;
	if (!card) throw new StudyError(404, 'No such card.');
	if (card.userId !== actor.id && !(await teachersOf(card.userId)).has(actor.id)) {
		throw new StudyError(404, 'No such card.');
	}
	const [lick, reviews, learner] = await Promise.all([
		Lick.findByPk(card.lickId, { attributes: ['title'] }),
		Review.findAll({
			where: { cardId: card.id },
			order: [
				['reviewedAt', 'DESC'],
				['createdAt', 'DESC']
			]
		}),
		loadLearner(card.userId)
	]);
	const state = cardStateOf(card);
	return {
		card: {
			...state,
			id: card.id,
			version: card.version,
			stateName: stateName(card.state),
			userId: card.userId,
			lickId: card.lickId,
			title: lick?.title ?? '',
			quality: card.quality,
			assignmentId: card.assignmentId ?? null,
			retiredAt: card.retiredAt ? new Date(card.retiredAt).toISOString() : null,
			retrievability: retrievability(schedulingOf(state), now, learner?.desiredRetention)
		},
		reviews: reviews.map(reviewRecordOf)
	};
}
