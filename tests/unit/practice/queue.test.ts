import { describe, expect, it } from 'vitest';
import { dayBounds, practiceDay } from '../../../src/lib/practice/day';
import {
	buildQueue,
	DEFAULT_SECONDS_PER_CARD,
	estimateSecondsPerCard,
	type QueueCard,
	type QueueInput
} from '../../../src/lib/practice/queue';
import { newSchedulingState } from '../../../src/lib/practice/scheduler';

const NOW = new Date('2026-03-10T18:00:00Z');
const DAY = 86_400_000;
const DAY_NAME = practiceDay(NOW, 'UTC', 4);
const { end: DAY_END } = dayBounds(DAY_NAME, 'UTC', 4);

let serial = 0;
function review(
	lickId: string,
	opts: { stability: number; daysAgo: number; dueIn?: number }
): QueueCard {
	serial++;
	const last = new Date(NOW.getTime() - opts.daysAgo * DAY);
	return {
		...newSchedulingState(last),
		id: `r${String(serial).padStart(3, '0')}`,
		lickId,
		assignmentId: null,
		newPosition: 0,
		introducedDay: '2026-01-01',
		retired: false,
		state: 2,
		stability: opts.stability,
		difficulty: 5,
		reps: 3,
		lastReview: last,
		due: new Date(NOW.getTime() + (opts.dueIn ?? -1) * DAY)
	};
}
function fresh(lickId: string, position: number, assignmentId: string | null = null): QueueCard {
	serial++;
	return {
		...newSchedulingState(NOW),
		id: `n${String(serial).padStart(3, '0')}`,
		lickId,
		assignmentId,
		newPosition: position,
		introducedDay: null,
		retired: false
	};
}

function input(cards: QueueCard[], over: Partial<QueueInput> = {}): QueueInput {
	return {
		now: NOW,
		day: DAY_NAME,
		dayEnd: DAY_END,
		cards,
		sources: new Map(),
		ownSource: { newPerDay: 5, active: true },
		introducedToday: new Map(),
		licksIntroducedToday: new Set(),
		dailyMinutes: 15,
		secondsPerCard: 45,
		...over
	};
}

describe('buildQueue', () => {
	it('puts due cards first, least likely remembered first, then new cards by position', () => {
		const safe = review('a', { stability: 30, daysAgo: 10 });
		const risky = review('b', { stability: 2, daysAgo: 10 });
		const middling = review('c', { stability: 8, daysAgo: 10 });
		const later = review('d', { stability: 8, daysAgo: 1, dueIn: 3 });
		const n2 = fresh('e', 2);
		const n1 = fresh('f', 1);
		const q = buildQueue(input([safe, risky, middling, later, n2, n1]));
		expect(q.entries.map((e) => e.card.id)).toEqual([risky.id, middling.id, safe.id, n1.id, n2.id]);
		expect(q.entries.map((e) => e.isNew)).toEqual([false, false, false, true, true]);
		expect([q.due, q.new]).toEqual([3, 2]);
		expect(q.entries[0].retrievability!).toBeLessThan(q.entries[1].retrievability!);
	});

	it('introduces new cards at each source pace: an assignment per day, the learner their own', () => {
		const cards = [
			...Array.from({ length: 6 }, (_, i) => fresh(`x${i}`, i, 'as-1')),
			...Array.from({ length: 6 }, (_, i) => fresh(`y${i}`, i, 'as-paused')),
			...Array.from({ length: 6 }, (_, i) => fresh(`z${i}`, i))
		];
		const q = buildQueue(
			input(cards, {
				dailyMinutes: 120,
				sources: new Map([
					['as-1', { newPerDay: 3, active: true }],
					['as-paused', { newPerDay: 3, active: false }]
				]),
				ownSource: { newPerDay: 2, active: true },
				introducedToday: new Map([['as-1', 1]])
			})
		);
		const bySource = (s: string | null) =>
			q.entries.filter((e) => e.card.assignmentId === s).length;
		expect([bySource('as-1'), bySource('as-paused'), bySource(null)]).toEqual([2, 0, 2]);
	});

	it('introduces at most one card of a lick a day, and none of a retired source', () => {
		const a = fresh('same', 1);
		const b = fresh('same', 2);
		const c = { ...fresh('other', 3), retired: true };
		const d = fresh('already', 4);
		const q = buildQueue(input([a, b, c, d], { licksIntroducedToday: new Set(['already']) }));
		expect(q.entries.map((e) => e.card.id)).toEqual([a.id]);
	});

	it('shows one review card of a lick a day: its sibling waits', () => {
		const a = review('lick', { stability: 2, daysAgo: 5 });
		const b = review('lick', { stability: 3, daysAgo: 5 });
		const q = buildQueue(input([a, b]));
		expect(q.entries.map((e) => e.card.id)).toEqual([a.id]);
		const after = buildQueue(input([b], { licksReviewedToday: new Set(['lick']) }));
		expect(after.entries).toEqual([]);
	});

	it('keeps within the daily minutes and says how long a backlog takes', () => {
		const backlog = Array.from({ length: 50 }, (_, i) =>
			review(`l${i}`, { stability: 1 + i, daysAgo: 30 })
		);
		const q = buildQueue(
			input([...backlog, fresh('n', 0)], { dailyMinutes: 10, secondsPerCard: 60 })
		);
		expect(q.dailyCap).toBe(10);
		expect(q.due).toBe(10);
		expect(q.new).toBe(0);
		expect(q.overdue).toBe(50);
		expect(q.catchUpDays).toBe(5);
		expect(q.estimatedMinutes).toBe(10);
		// The ten shown are the ten most at risk.
		const risk = q.entries.map((e) => e.retrievability!);
		const rest = backlog.filter((c) => !q.entries.some((e) => e.card.id === c.id));
		expect(Math.max(...risk)).toBeLessThan(Math.min(...rest.map((c) => c.stability)));
	});

	it('puts a learning step due later today after everything due now', () => {
		const step = {
			...review('s', { stability: 0.5, daysAgo: 0 }),
			state: 1,
			due: new Date(NOW.getTime() + 600_000)
		};
		const old = review('o', { stability: 20, daysAgo: 1 });
		const q = buildQueue(input([step, old]));
		expect(q.entries.map((e) => e.card.id)).toEqual([old.id, step.id]);
	});

	// Practice-day boundary around the day-start hour (04:00 local) at UTC−10, UTC+0, UTC+13
	// (IANA tz database as shipped with Node's ICU: Honolulu −10, Tongatapu +13 all year).
	it.each([
		['Pacific/Honolulu', '2026-03-11T13:59:00Z', true],
		['Pacific/Honolulu', '2026-03-11T14:00:00Z', false],
		['UTC', '2026-03-11T03:59:00Z', true],
		['UTC', '2026-03-11T04:00:00Z', false],
		['Pacific/Tongatapu', '2026-03-10T14:59:00Z', true],
		['Pacific/Tongatapu', '2026-03-10T15:00:00Z', false]
	] as const)('in %s a card due at %s is due today: %s', (zone, dueAt, isDue) => {
		// "Now" is 01:30 local, so the practice day is the evening before.
		const localNow = {
			'Pacific/Honolulu': '2026-03-11T11:30:00Z',
			UTC: '2026-03-11T01:30:00Z',
			'Pacific/Tongatapu': '2026-03-10T12:30:00Z'
		}[zone];
		const now = new Date(localNow);
		const day = practiceDay(now, zone, 4);
		expect(day).toBe('2026-03-10');
		const card = { ...review('x', { stability: 5, daysAgo: 3 }), due: new Date(dueAt) };
		const q = buildQueue(input([card], { now, day, dayEnd: dayBounds(day, zone, 4).end }));
		expect(q.due).toBe(isDue ? 1 : 0);
	});
});

describe('estimateSecondsPerCard', () => {
	it.each([
		[[], DEFAULT_SECONDS_PER_CARD],
		[[30_000, 40_000], DEFAULT_SECONDS_PER_CARD],
		[[30_000, 40_000, 50_000, 60_000, 70_000], 50],
		[[1, 2, 3, 4, 5, 6], 10],
		[[900_000, 900_000, 900_000, 900_000, 900_000], 300],
		[[Number.NaN, -5, 20_000, 20_000, 20_000, 20_000, 20_000], 20]
	])('from %j ms estimates %i s', (samples, out) => {
		expect(estimateSecondsPerCard(samples)).toBe(out);
	});
});
