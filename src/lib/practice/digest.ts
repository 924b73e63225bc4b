/**
 * What the daily reminder and the weekly class summary compute beyond the drill's own figures:
 * a class's weakest keys from tallies of grades per key (by the drill's measure of key strength),
 * the weekday a summary goes out on, and one line of encouragement. Pure.
 */
import { daysBetween } from './day';
import { keyPitchClass } from './keys';

/** Reviews of one key as stored (a concert tonic spelled as the prompt showed it). */
export interface KeyTally {
	key: string;
	reviews: number;
	/** Sum of the grades (1–4) of those reviews. */
	gradeSum: number;
}

export interface WeakKey {
	/** The spelling most reviews used, e.g. 'Eb' (F# and Gb are one key here). */
	key: string;
	reviews: number;
	/** The drill's key strength: mean grade mapped to 0–1 (grade 1 → 0, grade 4 → 1). */
	strength: number;
}

/**
 * The weakest keys, weakest first, by the drill's key strength (the learner's progress page uses
 * the same measure): enharmonic spellings are one key, and a key played without a flaw (strength
 * 1) is not called weak.
 * @example weakestKeys([{ key: 'Eb', reviews: 4, gradeSum: 8 }, { key: 'C', reviews: 3, gradeSum: 12 }]) // [{ key: 'Eb', reviews: 4, strength: 0.333… }]
 */
export function weakestKeys(tallies: readonly KeyTally[], count = 3): WeakKey[] {
	const byClass = new Map<
		number,
		{ spellings: Map<string, number>; reviews: number; sum: number }
	>();
	for (const tally of tallies) {
		const pc = keyPitchClass(tally.key);
		if (pc === null || tally.reviews <= 0) continue;
		const entry = byClass.get(pc) ?? { spellings: new Map<string, number>(), reviews: 0, sum: 0 };
		entry.spellings.set(tally.key, (entry.spellings.get(tally.key) ?? 0) + tally.reviews);
		entry.reviews += tally.reviews;
		entry.sum += tally.gradeSum;
		byClass.set(pc, entry);
	}
	return [...byClass.values()]
		.map(({ spellings, reviews, sum }) => ({
			key: [...spellings].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))[0][0],
			reviews,
			strength: (sum / reviews - 1) / 3
		}))
		.filter((k) => k.strength < 1)
		.sort((a, b) => a.strength - b.strength || b.reviews - a.reviews || a.key.localeCompare(b.key))
		.slice(0, count);
}

/**
 * A key tonic as a reader sees it, with real flat and sharp signs.
 * @example formatKey('Eb') // 'E♭'
 */
export function formatKey(key: string): string {
	return key.replace(/b/g, '♭').replace(/#/g, '♯');
}

/**
 * ISO weekday of a day: 1 Monday … 7 Sunday.
 * @example isoWeekday('2026-03-02') // 1
 */
export function isoWeekday(day: string): number {
	// 2026-03-02 was a Monday (any known Monday would do as the anchor).
	return ((((daysBetween('2026-03-02', day) % 7) + 7) % 7) + 1) as number;
}

/** Our own lines, one per mail; none quotes anyone. */
export const ENCOURAGEMENTS: readonly string[] = [
	'Ten focused minutes beat an hour of noodling.',
	'Slow and clean today is fast and clean next month.',
	'Every key you play it in makes the other eleven easier.',
	'Play it once without looking before you check. That is where it sticks.',
	'A lick you can play in E is a lick you own.',
	'Short and daily wins: your memory works while you rest.',
	'Sing the line first, then play it. Your ear leads your hands.',
	'The hard key today is tomorrow’s easy one.',
	'Swing the eighths, land on the chord tone, breathe.',
	'Missed one? Good: that is exactly the one to come back to.',
	'Play it quietly once, loudly once, and once as if on the bandstand.',
	'Vocabulary grows one phrase at a time. Today adds one more.'
];

/**
 * The line of encouragement for a person on a day: stable for that pair (a resent mail says the
 * same), different from day to day.
 * @example encouragementFor('user-1', '2026-03-02') // one of ENCOURAGEMENTS
 */
export function encouragementFor(seed: string, day: string): string {
	// FNV-1a over the two strings: small, stable, no randomness source needed.
	let hash = 0x811c9dc5;
	for (const char of `${seed}|${day}`) {
		hash ^= char.codePointAt(0)!;
		hash = Math.imul(hash, 0x01000193) >>> 0;
	}
	return ENCOURAGEMENTS[hash % ENCOURAGEMENTS.length];
}
