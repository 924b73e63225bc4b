/**
 * Load balancing and sibling spreading, written for the drill: within the days ts-fsrs' fuzz
 * allows, prefer the day with fewer reviews already due, and keep a card off any day on which
 * another card of the same lick (over another chord quality) is due. Pure: the loads are passed
 * in, days are practice days in the learner's zone.
 */
import { practiceDay } from './day';
import type { DayRange } from './scheduler';

const DAY_MS = 86_400_000;

export interface BalanceContext {
	/** Cards already due on each practice day ('YYYY-MM-DD' → count). */
	dueByDay: ReadonlyMap<string, number>;
	/** Practice days on which a sibling (same lick, another quality) is due. */
	siblingDays: ReadonlySet<string>;
	timeZone: string;
	dayStartHour: number;
}

/** A sibling on a day weighs more than any plausible load, so it is avoided first. */
const SIBLING_COST = 1_000_000;

/**
 * The interval in days to use: the candidate day with the lowest load, a day holding a sibling
 * only when every candidate does; ties go to the day nearest ts-fsrs' own fuzzed pick. When every
 * day of the range holds a sibling the range widens by a day on each side (never below one day).
 * @example pickBalancedDays({ min: 5, max: 7, fuzzed: 6 }, now, { dueByDay: loads, … }) // 7 if day 7 is emptiest
 */
export function pickBalancedDays(range: DayRange, now: Date, ctx: BalanceContext): number {
	const dayOf = (d: number) =>
		practiceDay(new Date(now.getTime() + d * DAY_MS), ctx.timeZone, ctx.dayStartHour);
	const cost = (d: number) => {
		const day = dayOf(d);
		return (ctx.siblingDays.has(day) ? SIBLING_COST : 0) + (ctx.dueByDay.get(day) ?? 0);
	};
	const best = (min: number, max: number) => {
		let chosen = range.fuzzed;
		let chosenCost = Infinity;
		for (let d = min; d <= max; d++) {
			const c = cost(d);
			const nearer = Math.abs(d - range.fuzzed) < Math.abs(chosen - range.fuzzed);
			if (c < chosenCost || (c === chosenCost && nearer)) {
				chosen = d;
				chosenCost = c;
			}
		}
		return { chosen, chosenCost };
	};
	const first = best(range.min, range.max);
	if (first.chosenCost < SIBLING_COST) return first.chosen;
	const wider = best(Math.max(1, range.min - 1), range.max + 1);
	return wider.chosenCost < first.chosenCost ? wider.chosen : first.chosen;
}

/**
 * A `pickDays` hook for `gradeCard` from a balance context.
 * @example gradeCard(id, s, 3, now, { pickDays: balancer(ctx) })
 */
export function balancer(ctx: BalanceContext): (range: DayRange, now: Date) => number {
	return (range, now) => pickBalancedDays(range, now, ctx);
}
