/**
 * What the daily reminder and the weekly class summary say, computed from plain values: the
 * streak from practice days, the weakest keys from tallies of grades per key, how long today's
 * licks take from the learner's own timings, whether a person's mail hour has come, and one line
 * of encouragement. Pure: days, hours and tallies are passed in.
 */
import { chromaOf, parseNoteName } from '../music/pitch';
import { addDays, daysBetween } from './day';

/** A run of consecutive practice days. */
export interface Streak {
	/** Consecutive practice days ending today (when practised today) or yesterday. */
	days: number;
	/** Whether today already has a review, so the streak is kept. */
	practisedToday: boolean;
}

/**
 * The streak on `today` from the practice days that have at least one review (any order,
 * repeats allowed). A day without practice before today ends it; today itself may still come.
 * @example streakOn(['2026-03-01', '2026-02-28'], '2026-03-02') // { days: 2, practisedToday: false }
 */
export function streakOn(practiceDays: Iterable<string>, today: string): Streak {
	const days = new Set(practiceDays);
	const practisedToday = days.has(today);
	let day = practisedToday ? today : addDays(today, -1);
	let count = 0;
	while (days.has(day)) {
		count++;
		day = addDays(day, -1);
	}
	return { days: count, practisedToday };
}

/** Reviews of one key as stored (a concert tonic spelled as the prompt showed it). */
export interface KeyTally {
	key: string;
	reviews: number;
	/** Reviews graded 1, the lowest grade: not played from memory. */
	misses: number;
	/** Reviews graded 2: played, with trouble. */
	shaky: number;
}

export interface WeakKey {
	/** The spelling most reviews used, e.g. 'Eb' (F# and Gb are one key here). */
	key: string;
	reviews: number;
	/** Share of reviews missed, a shaky one counting half: 0…1. */
	missRate: number;
}

/**
 * The keys with the most trouble, worst first: enharmonic spellings are one key, and a key needs
 * at least one miss or shaky review to be called weak. The rate is pulled towards zero by two
 * imagined clean reviews, so one miss in one try does not outrank three in ten.
 * @example weakestKeys([{ key: 'Eb', reviews: 10, misses: 3, shaky: 0 }, { key: 'C', reviews: 9, misses: 0, shaky: 0 }]) // [{ key: 'Eb', reviews: 10, missRate: 0.3 }]
 */
export function weakestKeys(tallies: readonly KeyTally[], count = 3): WeakKey[] {
	const byChroma = new Map<number, { spellings: Map<string, number>; tally: KeyTally }>();
	for (const tally of tallies) {
		const note = parseNoteName(tally.key);
		if (!note || tally.reviews <= 0) continue;
		const chroma = chromaOf(note);
		const entry = byChroma.get(chroma) ?? {
			spellings: new Map<string, number>(),
			tally: { key: tally.key, reviews: 0, misses: 0, shaky: 0 }
		};
		entry.spellings.set(tally.key, (entry.spellings.get(tally.key) ?? 0) + tally.reviews);
		entry.tally.reviews += tally.reviews;
		entry.tally.misses += tally.misses;
		entry.tally.shaky += tally.shaky;
		byChroma.set(chroma, entry);
	}
	const ranked = [...byChroma.values()]
		.filter(({ tally }) => tally.misses + tally.shaky > 0)
		.map(({ spellings, tally }) => {
			const trouble = tally.misses + tally.shaky / 2;
			const key = [...spellings].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))[0][0];
			return {
				key,
				reviews: tally.reviews,
				missRate: trouble / tally.reviews,
				score: trouble / (tally.reviews + 2)
			};
		})
		.sort((a, b) => b.score - a.score || b.reviews - a.reviews || a.key.localeCompare(b.key));
	return ranked.slice(0, count).map(({ key, reviews, missRate }) => ({ key, reviews, missRate }));
}

/**
 * A key tonic as a reader sees it, with real flat and sharp signs.
 * @example formatKey('Eb') // 'E♭'
 */
export function formatKey(key: string): string {
	return key.replace(/b/g, '♭').replace(/#/g, '♯');
}

/** When the learner has no timed reviews yet: a prompt played, revealed and graded. */
export const DEFAULT_REVIEW_MS = 40_000;
/** A new lick is taught before it is tested: about twice a review. */
export const NEW_LICK_FACTOR = 2;

/**
 * The typical time of one review from the learner's own timings (ms from prompt to grade), the
 * median so that one prompt left open during a phone call does not count; null with fewer than
 * five timings.
 * @example typicalReviewMs([30_000, 32_000, 35_000, 600_000, 31_000]) // 32000
 */
export function typicalReviewMs(timings: readonly number[]): number | null {
	const usable = timings.filter((ms) => Number.isFinite(ms) && ms > 0).sort((a, b) => a - b);
	if (usable.length < 5) return null;
	const middle = Math.floor(usable.length / 2);
	const median =
		usable.length % 2 ? usable[middle] : Math.round((usable[middle - 1] + usable[middle]) / 2);
	// Between a glance and a long look: beyond ten minutes the timing is not practice.
	return Math.min(Math.max(median, 5_000), 600_000);
}

/**
 * Whole minutes (at least one when anything is due) for today's reviews and new licks.
 * @example estimateMinutes({ reviews: 10, newLicks: 2, msPerReview: 30_000 }) // 7
 */
export function estimateMinutes(input: {
	reviews: number;
	newLicks: number;
	msPerReview: number | null;
}): number {
	const per = input.msPerReview ?? DEFAULT_REVIEW_MS;
	const total = input.reviews * per + input.newLicks * per * NEW_LICK_FACTOR;
	return total > 0 ? Math.max(1, Math.round(total / 60_000)) : 0;
}

/**
 * Whether a mail set for local hour `mailHour` is due at local hour `localHour`, counting hours
 * from the start of the practice day: with the day starting at 4, a mail at 2 belongs to the
 * small hours at the end of the day, not before its start. Hours skipped by a clock change count
 * as passed.
 * @example mailHourHasCome(9, 7, 4) // true; mailHourHasCome(3, 2, 4) // true; mailHourHasCome(23, 2, 4) // false
 */
export function mailHourHasCome(localHour: number, mailHour: number, dayStartHour: number): boolean {
	const position = (hour: number) => (((hour - dayStartHour) % 24) + 24) % 24;
	return position(localHour) >= position(mailHour);
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
