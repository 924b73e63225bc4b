import { Op, QueryTypes, literal, type Transaction } from 'sequelize';
import { getDb } from '../db/index';
import { Assignment, Card, ClassMember } from '../db/models/index';

/**
 * The cards a class makes, per the drill contract: every member × deck lick × (home quality +
 * the assignment's qualities), inserted as new (state 0, due now) or ignored when the learner
 * already has that (user, lick, quality) card. Stopping a source retires its still-new cards;
 * cards already introduced, and every review, stay.
 */

/** Room between two licks' positions, so each quality of a lick gets its own slot. */
const QUALITY_SLOTS = 16;
const CHUNK = 400;

interface DeckLickRow {
	lick_id: string;
	position: number;
	home_quality: string;
}

/**
 * Create the cards of one assignment for `userIds` (insert-or-ignore), and put back to work any of
 * this assignment's new cards that were retired (a learner who left and came back) and that it
 * still asks for (a quality dropped from the assignment stays retired). With `onlyLicks`, only
 * those licks of the deck are concerned (licks just added to it); their place in the queue is
 * still their place in the deck.
 * @example await createAssignmentCards({ id, deckId, qualities: ['m7'] }, [learnerId], now, t) // 8 for 4 licks
 */
export async function createAssignmentCards(
	assignment: { id: string; deckId: string; qualities: string[] },
	userIds: string[],
	now: Date,
	transaction: Transaction,
	onlyLicks?: readonly string[]
): Promise<number> {
	if (userIds.length === 0 || onlyLicks?.length === 0) return 0;
	const deckLicks = await getDb().query<DeckLickRow>(
		`SELECT dl.lick_id, dl.position, l.home_quality
		   FROM deck_licks dl JOIN licks l ON l.id = dl.lick_id
		  WHERE dl.deck_id = :deckId
		  ORDER BY dl.position, dl.id`,
		{ replacements: { deckId: assignment.deckId }, type: QueryTypes.SELECT, transaction }
	);
	const rows: Array<{
		userId: string;
		lickId: string;
		quality: string;
		assignmentId: string;
		newPosition: number;
		due: Date;
	}> = [];
	for (const userId of userIds) {
		deckLicks.forEach((lick, index) => {
			if (onlyLicks && !onlyLicks.includes(lick.lick_id)) return;
			const qualities = [
				lick.home_quality,
				...assignment.qualities.filter((q) => q !== lick.home_quality)
			];
			qualities.forEach((quality, slot) => {
				rows.push({
					userId,
					lickId: lick.lick_id,
					quality,
					assignmentId: assignment.id,
					// Deck order first; a lick's qualities one after another (the drill spreads them).
					newPosition: index * QUALITY_SLOTS + slot,
					due: now
				});
			});
		});
	}
	for (let i = 0; i < rows.length; i += CHUNK) {
		// INSERT OR IGNORE on SQLite, ON CONFLICT DO NOTHING on PostgreSQL: the unique
		// (user, lick, quality) decides, so two processes cannot make a card twice.
		await Card.bulkCreate(rows.slice(i, i + CHUNK), { ignoreDuplicates: true, transaction });
	}
	const asked = assignment.qualities.length ? assignment.qualities : ['-'];
	await Card.update(
		{ retiredAt: null, version: literal('version + 1') as unknown as number },
		{
			where: {
				assignmentId: assignment.id,
				userId: { [Op.in]: userIds },
				...(onlyLicks ? { lickId: { [Op.in]: [...onlyLicks] } } : {}),
				state: 0,
				introducedDay: null,
				retiredAt: { [Op.ne]: null },
				[Op.or]: [
					{ quality: { [Op.in]: asked } },
					literal('cards.quality = (SELECT l.home_quality FROM licks l WHERE l.id = cards.lick_id)')
				]
			},
			transaction
		}
	);
	return rows.length;
}

/**
 * Licks just put into a deck reach every class the deck is assigned to: each member gets their
 * cards as if the licks had been in the deck when it was assigned (the assignment's qualities,
 * the lick's place in the deck; keys and pace are the assignment's, read by the drill). Paused
 * assignments and archived classes get the cards too, and the drill holds them back until they
 * resume, as it does with every other card of theirs.
 */
async function createCardsForAssignments(
	assignments: readonly Assignment[],
	deckId: string,
	lickIds: readonly string[],
	now: Date,
	transaction: Transaction
): Promise<number> {
	let made = 0;
	for (const assignment of assignments) {
		const members = await ClassMember.findAll({
			where: { classId: assignment.classId },
			attributes: ['userId'],
			transaction
		});
		made += await createAssignmentCards(
			{ id: assignment.id, deckId, qualities: assignment.qualities ?? [] },
			members.map((m) => m.userId),
			now,
			transaction,
			lickIds
		);
	}
	return made;
}

/**
 * A deck was edited (`lickIds`, the whole deck in its new order): in every class it is assigned
 * to, licks new to it become the members' cards, licks taken out retire their still-new cards (as
 * when any source stops: cards already introduced, and every review, stay; a lick put back is
 * put back to work), and still-new cards follow the deck's order.
 * @example await followDeckEdit(deckId, [b, a], { added: [b], removed: [c] }, now, t)
 */
export async function followDeckEdit(
	deckId: string,
	lickIds: readonly string[],
	change: { added: readonly string[]; removed: readonly string[] },
	now: Date,
	transaction: Transaction
): Promise<void> {
	const assignments = await Assignment.findAll({ where: { deckId }, transaction });
	if (assignments.length === 0) return;
	const ids = assignments.map((a) => a.id);
	if (change.added.length) {
		await createCardsForAssignments(assignments, deckId, change.added, now, transaction);
	}
	if (change.removed.length) await retireNewCards(ids, null, now, transaction, change.removed);
	if (lickIds.length === 0) return;
	// A new card's place is its lick's place in the deck, its quality's slot kept, in one
	// statement. Only the position moves: the card's version (what a review compares) is left
	// alone.
	const places: Record<string, string | number> = {};
	const cases = lickIds.map((lickId, index) => {
		places[`lick${index}`] = lickId;
		return `WHEN :lick${index} THEN ${index * QUALITY_SLOTS}`;
	});
	await getDb().query(
		`UPDATE cards SET new_position = (CASE lick_id ${cases.join(' ')} END) + (new_position % :slots)
		  WHERE assignment_id IN (:ids) AND lick_id IN (:lickIds) AND state = 0
		    AND introduced_day IS NULL`,
		{
			replacements: { ...places, slots: QUALITY_SLOTS, ids, lickIds: [...lickIds] },
			transaction
		}
	);
}

/**
 * Retire the still-new cards of the given assignments (all their learners, or only `userIds`;
 * all their licks, or only `lickIds`).
 * @example await retireNewCards([assignmentId], null, now, t) // number of cards retired
 */
export async function retireNewCards(
	assignmentIds: string[],
	userIds: string[] | null,
	now: Date,
	transaction: Transaction,
	lickIds?: readonly string[]
): Promise<number> {
	if (assignmentIds.length === 0) return 0;
	const [count] = await Card.update(
		{ retiredAt: now, version: literal('version + 1') as unknown as number },
		{
			where: {
				assignmentId: { [Op.in]: assignmentIds },
				...(userIds ? { userId: { [Op.in]: userIds } } : {}),
				...(lickIds ? { lickId: { [Op.in]: [...lickIds] } } : {}),
				state: 0,
				introducedDay: null,
				retiredAt: null
			},
			transaction
		}
	);
	return count;
}

/**
 * Retire an assignment's still-new cards of qualities it no longer asks for (a lick's home
 * quality is always kept).
 */
export async function retireDroppedQualities(
	assignmentId: string,
	qualities: string[],
	now: Date,
	transaction: Transaction
): Promise<void> {
	const keep = qualities.length ? qualities : ['-'];
	await getDb().query(
		`UPDATE cards SET retired_at = :now, version = version + 1
		  WHERE assignment_id = :assignmentId AND state = 0 AND introduced_day IS NULL
		    AND retired_at IS NULL AND quality NOT IN (:keep)
		    AND quality <> (SELECT l.home_quality FROM licks l WHERE l.id = cards.lick_id)`,
		{ replacements: { now, assignmentId, keep }, transaction }
	);
}
