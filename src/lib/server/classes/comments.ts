import { Op, QueryTypes } from 'sequelize';
import { getDb } from '../db/index';
import { Card, Comment } from '../db/models/index';
import { invalid, isId, isoOrNull, notFound, type Actor, type Result } from './common';
import { MAX_COMMENT } from '../../forms/classes';

/**
 * Comment threads on a learner's card, between the learner and the teacher of the class the card
 * came from. The learner reads the thread at the next reveal of that lick and can answer.
 */

export interface CommentView {
	id: string;
	cardId: string;
	author: { id: string; name: string };
	/** 'teacher' or 'learner': who in the pair wrote it. */
	by: 'teacher' | 'learner';
	text: string;
	createdAt: string;
	/** When the other party first read it. */
	seenAt: string | null;
}

export { MAX_COMMENT };

const cardNotFound = notFound('No such card among the ones you can comment on.');

/**
 * The card if the actor may read and write its thread: its learner, or the teacher of the class
 * its assignment belongs to while the learner is still in that class.
 */
async function accessibleCard(
	actor: Actor,
	cardId: unknown
): Promise<{ card: Card; as: 'learner' | 'teacher' } | null> {
	if (!isId(cardId)) return null;
	const card = await Card.findByPk(cardId);
	if (!card) return null;
	if (card.userId === actor.id) return { card, as: 'learner' };
	if (!card.assignmentId) return null;
	const [row] = await getDb().query<{ n: unknown }>(
		`SELECT COUNT(*) AS n FROM assignments a
		   JOIN classes c ON c.id = a.class_id
		   JOIN class_members m ON m.class_id = c.id AND m.user_id = :learnerId
		  WHERE a.id = :assignmentId AND c.teacher_id = :actorId`,
		{
			replacements: { learnerId: card.userId, assignmentId: card.assignmentId, actorId: actor.id },
			type: QueryTypes.SELECT
		}
	);
	return Number(row?.n ?? 0) > 0 ? { card, as: 'teacher' } : null;
}

interface CommentRow {
	id: string;
	card_id: string;
	author_id: string;
	author_name: string;
	learner_id: string;
	text: string;
	created_at: unknown;
	seen_at: unknown;
}

function toView(row: CommentRow): CommentView {
	return {
		id: row.id,
		cardId: row.card_id,
		author: { id: row.author_id, name: row.author_name },
		by: row.author_id === row.learner_id ? 'learner' : 'teacher',
		text: row.text,
		createdAt: isoOrNull(row.created_at) ?? '',
		seenAt: isoOrNull(row.seen_at)
	};
}

async function threadRows(cardIds: string[]): Promise<CommentRow[]> {
	if (cardIds.length === 0) return [];
	return getDb().query<CommentRow>(
		`SELECT m.id, m.card_id, m.author_id, u.name AS author_name, c.user_id AS learner_id,
		        m.text, m.created_at, m.seen_at
		   FROM comments m JOIN users u ON u.id = m.author_id JOIN cards c ON c.id = m.card_id
		  WHERE m.card_id IN (:cardIds)
		  ORDER BY m.created_at, m.id`,
		{ replacements: { cardIds }, type: QueryTypes.SELECT }
	);
}

/**
 * The thread of a card, oldest first. Reading it marks the other party's comments seen.
 * @example await listComments(learner, cardId) // { ok: true, items: [{ by: 'teacher', text: 'Try the Gb version slower', … }], total: 1 }
 */
export async function listComments(
	actor: Actor,
	cardId: unknown,
	now = new Date()
): Promise<Result<{ items: CommentView[]; total: number }>> {
	const access = await accessibleCard(actor, cardId);
	if (!access) return cardNotFound;
	const items = (await threadRows([access.card.id])).map(toView);
	await markSeen(access.card.id, actor.id, now);
	return { ok: true, items, total: items.length };
}

async function markSeen(cardId: string, readerId: string, now: Date): Promise<void> {
	await Comment.update(
		{ seenAt: now },
		{ where: { cardId, authorId: { [Op.ne]: readerId }, seenAt: null } }
	);
}

/**
 * Add to a card's thread (1 to 2000 characters).
 * @example await postComment(teacher, cardId, { text: 'Lovely in Db. Now try it at 120.' }) // { ok: true, comment: { by: 'teacher', … } }
 */
export async function postComment(
	actor: Actor,
	cardId: unknown,
	input: { text?: unknown }
): Promise<Result<{ comment: CommentView }>> {
	const access = await accessibleCard(actor, cardId);
	if (!access) return cardNotFound;
	const text = typeof input.text === 'string' ? input.text.trim() : '';
	if (!text || text.length > MAX_COMMENT) {
		return invalid('text', `Write a comment of 1 to ${MAX_COMMENT} characters.`);
	}
	const row = await Comment.create({ cardId: access.card.id, authorId: actor.id, text });
	const [view] = (await threadRows([access.card.id])).filter((r) => r.id === row.id).map(toView);
	return { ok: true, comment: view };
}

/**
 * The threads of a learner's own cards, for the drill's queue (`comments` on each item). Only
 * cards of `userId` are read, whatever ids are passed; nothing is marked seen (reading the
 * thread through `listComments` does that).
 * @example await commentsForCards(learnerId, [cardA, cardB]) // { [cardA]: [{ by: 'teacher', … }] }
 */
export async function commentsForCards(
	userId: string,
	cardIds: string[]
): Promise<Record<string, CommentView[]>> {
	const ids = cardIds.filter(isId);
	if (ids.length === 0) return {};
	const own = await getDb().query<{ id: string }>(
		'SELECT id FROM cards WHERE user_id = :userId AND id IN (:ids)',
		{ replacements: { userId, ids }, type: QueryTypes.SELECT }
	);
	const out: Record<string, CommentView[]> = {};
	for (const row of await threadRows(own.map((c) => c.id))) {
		(out[row.card_id] ??= []).push(toView(row));
	}
	return out;
}

/**
 * Mark the teacher's comments on a learner's own cards seen (the drill calls this when the
 * learner reaches the reveal of that lick, where the thread is shown). Ids of cards that are not
 * the learner's are passed over; the answer says how many of the ids were theirs.
 * @example await markCommentsSeen(learnerId, [cardId]) // { cards: 1 }
 */
export async function markCommentsSeen(
	userId: string,
	cardIds: string[],
	now = new Date()
): Promise<{ cards: number }> {
	const ids = cardIds.filter(isId);
	if (ids.length === 0) return { cards: 0 };
	const own = await getDb().query<{ id: string }>(
		'SELECT id FROM cards WHERE user_id = :userId AND id IN (:ids)',
		{ replacements: { userId, ids }, type: QueryTypes.SELECT }
	);
	if (own.length === 0) return { cards: 0 };
	await getDb().query(
		`UPDATE comments SET seen_at = :now
		  WHERE seen_at IS NULL AND author_id <> :userId AND card_id IN (:own)`,
		{ replacements: { now, userId, own: own.map((c) => c.id) } }
	);
	return { cards: own.length };
}
