import { writeTunes } from '../../library/abc-file';
import type { Actor } from './access';
import { getDeck } from './decks';
import { getLick, type LickDetail } from './licks';

/**
 * Export licks as an `.abc` file that imports back to the same licks: title, abc, tempo (its
 * `Q:`), feel, tags, teaching note and hand-written versions (see `abc-file.ts`).
 */

function fileOf(licks: LickDetail[]): string {
	const parts: string[] = [];
	let n = 1;
	for (const lick of licks) {
		const { text, next } = writeTunes(lick, lick.versions as Record<string, string>, n);
		parts.push(text);
		n = next;
	}
	return parts.join('\n\n') + '\n';
}

/** A file name from a title: letters, digits and hyphens. */
export function fileNameOf(title: string): string {
	const base = title
		.normalize('NFKD')
		.replace(/[^\w\s-]/g, '')
		.trim()
		.toLowerCase()
		.replace(/[\s_]+/g, '-')
		.slice(0, 60);
	return `${base || 'licks'}.abc`;
}

/**
 * One lick the actor may read, as an abc file.
 * @example await exportLick(user, id) // { name: 'blue-turn.abc', text: 'X:1\nT:Blue turn…' }
 */
export async function exportLick(
	actor: Actor,
	id: string
): Promise<{ name: string; text: string }> {
	const lick = await getLick(actor, id);
	return { name: fileNameOf(lick.title), text: fileOf([lick]) };
}

/**
 * A deck's licks (those the actor may read), in order, as one abc file.
 * @example await exportDeck(user, deckId) // { name: 'first-steps.abc', text: … }
 */
export async function exportDeck(
	actor: Actor,
	id: string
): Promise<{ name: string; text: string }> {
	const deck = await getDeck(actor, id);
	const licks: LickDetail[] = [];
	for (const l of deck.licks) licks.push(await getLick(actor, l.id));
	return { name: fileNameOf(deck.name), text: fileOf(licks) };
}
