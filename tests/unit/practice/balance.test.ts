import { describe, expect, it } from 'vitest';
import { balancer, pickBalancedDays, type BalanceContext } from '../../../src/lib/practice/balance';
import { addDays, dayBounds, practiceDay } from '../../../src/lib/practice/day';
import { seededRandom } from '../../../src/lib/practice/random';
import {
	gradeCard,
	newSchedulingState,
	type SchedulingState
} from '../../../src/lib/practice/scheduler';
import type { GradeValue } from '../../../src/lib/practice/api';

const NOW = new Date('2026-03-01T18:00:00Z');
const ctx = (loads: Record<string, number>, siblings: string[] = []): BalanceContext => ({
	dueByDay: new Map(Object.entries(loads)),
	siblingDays: new Set(siblings),
	timeZone: 'UTC',
	dayStartHour: 4
});

describe('pickBalancedDays', () => {
	it.each([
		// range, loads by day, sibling days, chosen interval
		[{ min: 5, max: 7, fuzzed: 6 }, {}, [], 6],
		[{ min: 5, max: 7, fuzzed: 6 }, { '2026-03-06': 5, '2026-03-07': 9, '2026-03-08': 2 }, [], 7],
		[{ min: 5, max: 7, fuzzed: 6 }, { '2026-03-06': 1, '2026-03-07': 1, '2026-03-08': 1 }, [], 6],
		[{ min: 5, max: 7, fuzzed: 6 }, {}, ['2026-03-07'], 5],
		[{ min: 5, max: 7, fuzzed: 5 }, { '2026-03-07': 0 }, ['2026-03-06'], 6],
		// Every day of the range holds a sibling: a day either side is tried.
		[{ min: 2, max: 2, fuzzed: 2 }, {}, ['2026-03-03'], 1],
		[{ min: 1, max: 1, fuzzed: 1 }, {}, ['2026-03-02'], 2]
	] as const)('in %j with loads %j and siblings on %j picks %i days', (range, loads, sib, out) => {
		expect(pickBalancedDays(range, NOW, ctx(loads, [...sib]))).toBe(out);
	});
});

/**
 * A simulated learner: `licks` licks, each over two qualities (siblings), five new cards a day
 * and at most one card of a lick introduced a day, reviewing everything due every evening at
 * 18:00 UTC for `days` days, grading 10% again, 10% hard, 70% good, 10% easy (seeded).
 */
function simulate(balanced: boolean, licks = 30, days = 120) {
	type SimCard = { id: string; lick: number; s: SchedulingState };
	const cards: SimCard[] = [];
	for (let l = 0; l < licks; l++) {
		for (const q of ['7', 'm7']) {
			cards.push({ id: `lick${l}-${q}`, lick: l, s: newSchedulingState(NOW) });
		}
	}
	const random = seededRandom('simulated learner');
	const grade = (): GradeValue => {
		const r = random();
		return r < 0.1 ? 1 : r < 0.2 ? 2 : r < 0.9 ? 3 : 4;
	};
	const perDay: number[] = [];
	let siblingClashes = 0;
	const day0 = practiceDay(NOW, 'UTC', 4);
	const introduced = new Set<string>();
	for (let d = 0; d < days; d++) {
		const day = addDays(day0, d);
		const { end } = dayBounds(day, 'UTC', 4);
		let now = new Date(NOW.getTime() + d * 86_400_000);
		// Five new cards, one a lick.
		const licksToday = new Set<number>();
		for (const c of cards) {
			if (licksToday.size >= 5) break;
			if (introduced.has(c.id) || licksToday.has(c.lick)) continue;
			introduced.add(c.id);
			licksToday.add(c.lick);
			c.s = { ...c.s, due: now };
		}
		let reviews = 0;
		for (;;) {
			const due = cards
				.filter((c) => introduced.has(c.id) && c.s.due.getTime() < end.getTime())
				.sort((a, b) => a.s.due.getTime() - b.s.due.getTime());
			if (due.length === 0) break;
			const c = due[0];
			if (c.s.due.getTime() > now.getTime()) now = c.s.due;
			const dueByDay = new Map<string, number>();
			const siblingDays = new Set<string>();
			for (const o of cards) {
				if (o === c || !introduced.has(o.id) || o.s.state !== 2) continue;
				const od = practiceDay(o.s.due, 'UTC', 4);
				dueByDay.set(od, (dueByDay.get(od) ?? 0) + 1);
				if (o.lick === c.lick) siblingDays.add(od);
			}
			const pickDays = balanced
				? balancer({ dueByDay, siblingDays, timeZone: 'UTC', dayStartHour: 4 })
				: undefined;
			c.s = gradeCard(c.id, c.s, grade(), now, { pickDays }).after;
			reviews++;
			now = new Date(now.getTime() + 30_000);
		}
		perDay.push(reviews);
		// At the day's end: siblings in review on the same future day?
		const byLick = new Map<number, Set<string>>();
		for (const c of cards) {
			if (!introduced.has(c.id) || c.s.state !== 2) continue;
			const dueDay = practiceDay(c.s.due, 'UTC', 4);
			const set = byLick.get(c.lick) ?? new Set();
			if (set.has(dueDay)) siblingClashes++;
			set.add(dueDay);
			byLick.set(c.lick, set);
		}
	}
	return { perDay, siblingClashes };
}

function spread(counts: number[]): number {
	const mean = counts.reduce((a, b) => a + b, 0) / counts.length;
	return Math.sqrt(counts.reduce((a, b) => a + (b - mean) ** 2, 0) / counts.length);
}

describe('a simulated learner over four months', () => {
	const plain = simulate(false);
	const balanced = simulate(true);

	it('never has two siblings due the same day with balancing', () => {
		expect(balanced.siblingClashes).toBe(0);
		// Without it they do clash: the check can fail.
		expect(plain.siblingClashes).toBeGreaterThan(0);
	});

	it('has flatter daily review counts with balancing than without', () => {
		// Past the first weeks of introductions, when every day's load is set by new cards.
		const settled = (c: number[]) => c.slice(40);
		const a = spread(settled(balanced.perDay));
		const b = spread(settled(plain.perDay));
		expect(a).toBeLessThan(b);
		// About the same work overall: balancing moves reviews, it does not drop them.
		const total = (c: number[]) => c.reduce((x, y) => x + y, 0);
		expect(
			Math.abs(total(balanced.perDay) - total(plain.perDay)) / total(plain.perDay)
		).toBeLessThan(0.15);
	});
});
