/**
 * Streaks over practice days: days in a row with at least one review. Pure.
 */
import { addDays, daysBetween } from './day';

/**
 * The current streak (ending today, or yesterday while today has no review yet: the day is
 * still open) and the longest one, from the days that had reviews (any order, repeats allowed).
 * @example streakOf(['2026-03-01', '2026-03-02'], '2026-03-03') // { current: 2, longest: 2 }
 */
export function streakOf(
	days: readonly string[],
	today: string
): { current: number; longest: number } {
	const sorted = [...new Set(days)].filter((d) => d <= today).sort();
	let longest = 0;
	let run = 0;
	for (let i = 0; i < sorted.length; i++) {
		run = i > 0 && daysBetween(sorted[i - 1], sorted[i]) === 1 ? run + 1 : 1;
		longest = Math.max(longest, run);
	}
	const set = new Set(sorted);
	let current = 0;
	let day = set.has(today) ? today : addDays(today, -1);
	while (set.has(day)) {
		current++;
		day = addDays(day, -1);
	}
	return { current, longest };
}
