/**
 * What a learner can add to their drill, for the learner's home: their own decks and licks, the
 * licks their teachers share with their classes, and public licks, each with how much of it is
 * in their drill already. Read only; adding goes through `POST /api/cards` (`addCards`), which
 * checks the same rules again.
 */
import { QueryTypes } from 'sequelize';
import { getDb } from '../db/index';
import type { Actor } from './learner';

export interface AddableLick {
	id: string;
	title: string;
	homeKey: string;
	homeQuality: string;
	/** Whose it is, as the learner sees it. */
	source: 'mine' | 'teacher' | 'public';
	authorName: string;
	/** Cards of this lick already in the learner's drill (any quality). */
	cards: number;
}

export interface AddableDeck {
	id: string;
	name: string;
	licks: number;
	/** Licks of the deck already in the learner's drill. */
	inDrill: number;
}

export interface Addable {
	decks: AddableDeck[];
	licks: AddableLick[];
}

/** At most this many licks listed; the library lists the rest. */
export const ADDABLE_LIMIT = 60;

/**
 * The learner's decks and the licks they may drill, own licks first, then their teachers', then
 * public ones, each group by title.
 * @example await listAddable({ id }) // { decks: [{ name: 'Warm-ups', licks: 4, inDrill: 1 }], licks: [...] }
 */
export async function listAddable(actor: Actor): Promise<Addable> {
	const db = getDb();
	const decks = await db.query<{ id: string; name: string; licks: number; in_drill: number }>(
		`SELECT d.id, d.name,
		        COUNT(dl.lick_id) AS licks,
		        COUNT(DISTINCT c.lick_id) AS in_drill
		 FROM decks d
		 LEFT JOIN deck_licks dl ON dl.deck_id = d.id
		 LEFT JOIN cards c ON c.lick_id = dl.lick_id AND c.user_id = :me AND c.retired_at IS NULL
		 WHERE d.owner_id = :me
		 GROUP BY d.id, d.name
		 ORDER BY d.name`,
		{ replacements: { me: actor.id }, type: QueryTypes.SELECT }
	);
	// Visibility as the drill's own rule has it: mine; `classes` from a teacher of a class I am
	// in; `public` from anyone.
	const licks = await db.query<{
		id: string;
		title: string;
		home_key: string;
		home_quality: string;
		source: 'mine' | 'teacher' | 'public';
		author_name: string;
		cards: number;
	}>(
		`SELECT l.id, l.title, l.home_key, l.home_quality, u.name AS author_name,
		        CASE WHEN l.author_id = :me THEN 'mine'
		             WHEN l.visibility = 'classes' OR l.author_id IN (
		               SELECT c.teacher_id FROM class_members m JOIN classes c ON c.id = m.class_id
		               WHERE m.user_id = :me) THEN 'teacher'
		             ELSE 'public' END AS source,
		        (SELECT COUNT(*) FROM cards k
		          WHERE k.lick_id = l.id AND k.user_id = :me AND k.retired_at IS NULL) AS cards
		 FROM licks l JOIN users u ON u.id = l.author_id
		 WHERE l.author_id = :me
		    OR l.visibility = 'public'
		    OR (l.visibility = 'classes' AND l.author_id IN (
		         SELECT c.teacher_id FROM class_members m JOIN classes c ON c.id = m.class_id
		         WHERE m.user_id = :me))
		 ORDER BY CASE WHEN l.author_id = :me THEN 0 WHEN l.visibility = 'classes' THEN 1 ELSE 2 END,
		          l.title, l.id
		 LIMIT ${ADDABLE_LIMIT}`,
		{ replacements: { me: actor.id }, type: QueryTypes.SELECT }
	);
	return {
		decks: decks.map((d) => ({
			id: d.id,
			name: d.name,
			licks: Number(d.licks),
			inDrill: Number(d.in_drill)
		})),
		licks: licks.map((l) => ({
			id: l.id,
			title: l.title,
			homeKey: l.home_key,
			homeQuality: l.home_quality,
			source: l.source,
			authorName: l.author_name,
			cards: Number(l.cards)
		}))
	};
}
