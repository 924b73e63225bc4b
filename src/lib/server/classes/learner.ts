import { QueryTypes } from 'sequelize';
import { getDb } from '../db/index';
import { clocksOf } from './clock';
import {
	assignmentIdsOf,
	classNotFound,
	isId,
	isMember,
	notFound,
	num,
	ownClass,
	type Actor,
	type Result
} from './common';
import { keyColumns, normalizeKey } from './keys';

/**
 * One learner seen by their teacher: a lick-by-key map of strength over the class's assigned
 * decks, the practice log and the tempo reached per lick. Only for the teacher of a class the
 * learner belongs to.
 */

/** How a key of a lick stands, in words (the screen never relies on colour alone). */
export type CellLevel = 'unplayed' | 'slipping' | 'settling' | 'secure';

/**
 * The level of a cell from its recall share; below three reviews it is only ever settling or
 * slipping, because two lucky recalls prove little.
 * @example cellLevel(0.9, 5) // 'secure'; cellLevel(null, 0) // 'unplayed'
 */
export function cellLevel(recall: number | null, reviews: number): CellLevel {
	if (recall === null || reviews === 0) return 'unplayed';
	if (recall < 0.6) return 'slipping';
	if (recall >= 0.85 && reviews >= 3) return 'secure';
	return 'settling';
}

export interface HeatCell {
	key: string;
	reviews: number;
	/** Share of reviews recalled (any grade but the lowest); null when never played in this key. */
	recall: number | null;
	/** Highest tempo of a good recall (top two grades) in this key. */
	tempo: number | null;
	level: CellLevel;
}

export interface HeatRow {
	lickId: string;
	title: string;
	/** The card comments attach to: the lick's card in its home quality (or its first card). */
	cardId: string;
	qualities: string[];
	introduced: boolean;
	/** Tempo ladder: best tempo reached over the lick's cards; target from the assignment or lick. */
	tempo: number | null;
	targetTempo: number;
	comments: number;
	/** Comments by the learner the teacher has not opened yet. */
	unread: number;
	cells: HeatCell[];
}

export interface LogDay {
	day: string;
	reviews: number;
	recalled: number;
	licks: number;
	minutes: number;
}

export interface LearnerView {
	learner: { id: string; name: string; keyOrder: string };
	className: string;
	/** The twelve key columns in the order the learner drills. */
	keys: string[];
	rows: HeatRow[];
	log: LogDay[];
}

/** Days of practice log shown. */
export const LOG_DAYS = 42;

/**
 * The heat map, log and tempi of one member of the actor's class.
 * @example await learnerDetail(teacher, classId, learnerId) // { ok: true, view: { keys: ['C', 'F', …], rows: [{ title: 'Blue turn', cells: [{ key: 'C', recall: 0.9, level: 'secure', … }] }] } }
 */
export async function learnerDetail(
	actor: Actor,
	classId: unknown,
	userId: unknown
): Promise<Result<{ view: LearnerView }>> {
	const cls = await ownClass(actor, classId);
	if (!cls) return classNotFound;
	if (!isId(userId) || !(await isMember(userId, cls.id))) {
		return notFound('No such learner in this class.');
	}
	const clock = (await clocksOf([userId])).get(userId);
	if (!clock) return notFound('No such learner in this class.');
	const keys = keyColumns(clock.keyOrder);
	const assignmentIds = await assignmentIdsOf(cls.id);
	const view: LearnerView = {
		learner: { id: userId, name: clock.name, keyOrder: clock.keyOrder },
		className: cls.name,
		keys,
		rows: [],
		log: []
	};
	if (assignmentIds.length === 0) return { ok: true, view };
	const db = getDb();
	const replacements = { userId, assignmentIds, teacherId: actor.id };

	const cards = await db.query<{
		id: string;
		lick_id: string;
		quality: string;
		home_quality: string;
		title: string;
		lick_tempo: unknown;
		target_tempo: unknown;
		tempo: unknown;
		state: unknown;
		retired_at: unknown;
		new_position: unknown;
		comments: unknown;
		unread: unknown;
	}>(
		`SELECT c.id, c.lick_id, c.quality, l.home_quality, l.title, l.tempo AS lick_tempo,
		        a.target_tempo, c.tempo, c.state, c.retired_at, c.new_position,
		        (SELECT COUNT(*) FROM comments m WHERE m.card_id = c.id) AS comments,
		        (SELECT COUNT(*) FROM comments m WHERE m.card_id = c.id
		            AND m.author_id = c.user_id AND m.seen_at IS NULL) AS unread
		   FROM cards c
		   JOIN licks l ON l.id = c.lick_id
		   JOIN assignments a ON a.id = c.assignment_id
		  WHERE c.user_id = :userId AND c.assignment_id IN (:assignmentIds)
		  ORDER BY a.created_at, c.new_position, c.id`,
		{ replacements, type: QueryTypes.SELECT }
	);
	const rows = new Map<string, HeatRow>();
	for (const card of cards) {
		const started = num(card.state) > 0;
		// A lick whose cards all retired unplayed was never part of this learner's work.
		if (!started && card.retired_at !== null) continue;
		let row = rows.get(card.lick_id);
		if (!row) {
			row = {
				lickId: card.lick_id,
				title: card.title,
				cardId: card.id,
				qualities: [],
				introduced: false,
				tempo: null,
				targetTempo: num(card.target_tempo ?? card.lick_tempo),
				comments: 0,
				unread: 0,
				cells: []
			};
			rows.set(card.lick_id, row);
		}
		if (card.quality === card.home_quality) row.cardId = card.id;
		row.qualities.push(card.quality);
		row.introduced ||= started;
		if (card.tempo !== null) row.tempo = Math.max(row.tempo ?? 0, num(card.tempo));
		row.comments += num(card.comments);
		row.unread += num(card.unread);
	}

	const cells = await db.query<{
		lick_id: string;
		key: string;
		reviews: unknown;
		recalled: unknown;
		tempo: unknown;
	}>(
		`SELECT r.lick_id, r.key, COUNT(*) AS reviews,
		        SUM(CASE WHEN r.grade > 1 THEN 1 ELSE 0 END) AS recalled,
		        MAX(CASE WHEN r.grade >= 3 THEN r.tempo END) AS tempo
		   FROM reviews r JOIN cards c ON c.id = r.card_id
		  WHERE r.user_id = :userId AND c.assignment_id IN (:assignmentIds) AND r.undone_at IS NULL
		  GROUP BY r.lick_id, r.key`,
		{ replacements, type: QueryTypes.SELECT }
	);
	const tally = new Map<string, { reviews: number; recalled: number; tempo: number | null }>();
	for (const cell of cells) {
		const id = `${cell.lick_id}|${normalizeKey(cell.key) ?? cell.key}`;
		const acc = tally.get(id) ?? { reviews: 0, recalled: 0, tempo: null };
		acc.reviews += num(cell.reviews);
		acc.recalled += num(cell.recalled);
		if (cell.tempo !== null) acc.tempo = Math.max(acc.tempo ?? 0, num(cell.tempo));
		tally.set(id, acc);
	}
	for (const row of rows.values()) {
		row.cells = keys.map((key) => {
			const acc = tally.get(`${row.lickId}|${key}`);
			const reviews = acc?.reviews ?? 0;
			const recall = acc && reviews > 0 ? acc.recalled / reviews : null;
			return { key, reviews, recall, tempo: acc?.tempo ?? null, level: cellLevel(recall, reviews) };
		});
	}
	view.rows = [...rows.values()];

	const log = await db.query<{
		day: string;
		reviews: unknown;
		recalled: unknown;
		licks: unknown;
		ms: unknown;
	}>(
		`SELECT r.day, COUNT(*) AS reviews, SUM(CASE WHEN r.grade > 1 THEN 1 ELSE 0 END) AS recalled,
		        COUNT(DISTINCT r.lick_id) AS licks,
		        SUM(COALESCE(r.reveal_ms, 0) + COALESCE(r.grade_ms, 0)) AS ms
		   FROM reviews r JOIN cards c ON c.id = r.card_id
		  WHERE r.user_id = :userId AND c.assignment_id IN (:assignmentIds) AND r.undone_at IS NULL
		  GROUP BY r.day ORDER BY r.day DESC LIMIT ${LOG_DAYS}`,
		{ replacements, type: QueryTypes.SELECT }
	);
	view.log = log.map((d) => ({
		day: d.day,
		reviews: num(d.reviews),
		recalled: num(d.recalled),
		licks: num(d.licks),
		minutes: Math.round(num(d.ms) / 60_000)
	}));
	return { ok: true, view };
}
