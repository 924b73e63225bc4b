import { literal } from 'sequelize';
import { getDb } from '../db/index';
import type { Role } from '../db/models/index';

/**
 * Who may see what in the library, written once as SQL conditions so that a list, a search and a
 * single read all apply the same rule:
 * - a lick: its author; anyone when it is public; a member of one of the author's classes when
 *   it is shared with classes; a member of a class that has a deck holding it assigned;
 * - a deck: its owner; a member of a class it is assigned to.
 * Only the author changes a lick and only the owner changes a deck.
 */

/** The person acting: enough of the session user for every access decision. */
export interface Actor {
	id: string;
	role: Role;
}

const quote = (value: string) => getDb().escape(value);

/**
 * SQL that is true when `actor` may read the lick row aliased `alias` (Sequelize names the main
 * table after the model, `"Lick"`). Double-quoted identifiers work on SQLite and PostgreSQL.
 * @example readableLickSql(actor) // '("Lick"."author_id" = \'…\' OR …)'
 */
export function readableLickSql(actor: Actor, alias = '"Lick"'): string {
	const me = quote(actor.id);
	return `(${alias}."author_id" = ${me}
		OR ${alias}."visibility" = 'public'
		OR (${alias}."visibility" = 'classes' AND EXISTS (
			SELECT 1 FROM "class_members" AS cm JOIN "classes" AS c ON c."id" = cm."class_id"
			WHERE cm."user_id" = ${me} AND c."teacher_id" = ${alias}."author_id"))
		OR EXISTS (
			SELECT 1 FROM "deck_licks" AS dl
			JOIN "assignments" AS a ON a."deck_id" = dl."deck_id"
			JOIN "class_members" AS am ON am."class_id" = a."class_id"
			WHERE dl."lick_id" = ${alias}."id" AND am."user_id" = ${me}))`;
}

/** The same rule as a Sequelize `where` part. */
export function readableLick(actor: Actor, alias?: string) {
	return literal(readableLickSql(actor, alias));
}

/**
 * SQL that is true when `actor` may read the deck row aliased `alias`.
 * @example readableDeckSql(actor) // '("Deck"."owner_id" = \'…\' OR …)'
 */
export function readableDeckSql(actor: Actor, alias = '"Deck"'): string {
	const me = quote(actor.id);
	return `(${alias}."owner_id" = ${me} OR EXISTS (
		SELECT 1 FROM "assignments" AS a JOIN "class_members" AS am ON am."class_id" = a."class_id"
		WHERE a."deck_id" = ${alias}."id" AND am."user_id" = ${me}))`;
}

export function readableDeck(actor: Actor, alias?: string) {
	return literal(readableDeckSql(actor, alias));
}
