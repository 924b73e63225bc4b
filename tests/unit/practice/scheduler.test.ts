import { describe, expect, it } from 'vitest';
import {
	createEmptyCard,
	fsrs,
	generatorParameters,
	GenSeedStrategyWithCardId,
	StrategyMode,
	type Card,
	type Grade
} from 'ts-fsrs';
import {
	createScheduler,
	fromFsrsCard,
	gradeCard,
	newSchedulingState,
	previewDue,
	retrievability,
	SCHEDULER_PARAMETERS,
	serializeState,
	undoGrade,
	type SchedulingState
} from '../../../src/lib/practice/scheduler';
import type { GradeValue } from '../../../src/lib/practice/api';

const T0 = new Date('2026-03-01T10:00:00Z');
const DAY = 86_400_000;

/** Grade a sequence, each review at the moment the card falls due. */
function run(cardId: string, grades: GradeValue[], options = {}) {
	let s = newSchedulingState(T0);
	let now = T0;
	const steps: {
		before: SchedulingState;
		after: SchedulingState;
		result: ReturnType<typeof gradeCard>;
	}[] = [];
	for (const g of grades) {
		const result = gradeCard(cardId, s, g, now, options);
		steps.push({ before: s, after: result.after, result });
		s = result.after;
		now = s.due;
	}
	return steps;
}

describe('scheduler against published values', () => {
	// REFERENCES.md §6, from ts-fsrs 5.4.2 `__tests__/strategies/learning-steps.test.ts`:
	// a new card's first grade 1..4 brings it back in 1 min, 6 min, 10 min and 8 days, with
	// stability 0.212, 1.2931, 2.3065, 8.2956 (FSRS-6 defaults).
	it.each([
		[1, 60_000, 0.212],
		[2, 6 * 60_000, 1.2931],
		[3, 10 * 60_000, 2.3065],
		[4, 8 * DAY, 8.2956]
	] as const)('a new card graded %i comes back after %i ms with stability %f', (grade, ms, s) => {
		const { after } = gradeCard('x', newSchedulingState(T0), grade, T0, { fuzz: false });
		expect(after.due.getTime() - T0.getTime()).toBe(ms);
		expect(after.stability).toBeCloseTo(s, 4);
	});

	// REFERENCES.md §6, from ts-fsrs 5.4.2 `__tests__/FSRS-6.test.ts`: Good×6, Again×2, Good×5
	// reviewed on time give intervals [0,2,11,46,163,498,0,0,2,4,7,12,21] with fuzz off.
	it('gives the published interval sequence for Good×6, Again×2, Good×5 with fuzz off', () => {
		const grades = [3, 3, 3, 3, 3, 3, 1, 1, 3, 3, 3, 3, 3] as GradeValue[];
		const intervals = run('x', grades, { fuzz: false }).map((s) => s.after.scheduledDays);
		expect(intervals).toEqual([0, 2, 11, 46, 163, 498, 0, 0, 2, 4, 7, 12, 21]);
	});

	// REFERENCES.md §6, from ts-fsrs 5.4.2 `__tests__/algorithm.test.ts`: R at S = 1 after
	// t = 0..3 days is 1.0, 0.9, 0.84588465, 0.8093881.
	it.each([
		[0, 1.0],
		[1, 0.9],
		[2, 0.84588465],
		[3, 0.8093881]
	])('retrievability at stability 1 after %i days is %f', (t, r) => {
		const s: SchedulingState = {
			...newSchedulingState(T0),
			state: 2,
			stability: 1,
			lastReview: T0
		};
		expect(retrievability(s, new Date(T0.getTime() + t * DAY))).toBeCloseTo(r, 6);
	});

	it('orders by fractional days: half a day later a card is less likely remembered', () => {
		const s: SchedulingState = {
			...newSchedulingState(T0),
			state: 2,
			stability: 3,
			lastReview: T0
		};
		const morning = retrievability(s, new Date(T0.getTime() + 2 * DAY))!;
		const evening = retrievability(s, new Date(T0.getTime() + 2.5 * DAY))!;
		expect(evening).toBeLessThan(morning);
		expect(retrievability(newSchedulingState(T0), T0)).toBeNull();
	});
});

describe('scheduler against ts-fsrs run directly', () => {
	/** ts-fsrs 5.4.2 with the same parameters and the same seed strategy, graded by hand. */
	function direct(cardId: string, grades: Grade[], retention: number) {
		const f = fsrs(
			generatorParameters({ ...SCHEDULER_PARAMETERS, request_retention: retention })
		).useStrategy(StrategyMode.SEED, GenSeedStrategyWithCardId('cardId'));
		let card = { ...createEmptyCard(T0), cardId } as Card & { cardId: string };
		const out: Card[] = [];
		for (const g of grades) {
			card = { ...f.next(card, card.due, g).card, cardId };
			out.push(card);
		}
		return out;
	}

	it.each([
		['card-a', 0.9, [3, 3, 3, 3, 3, 3, 1, 1, 3, 3, 3, 3, 3]],
		['card-b', 0.9, [4, 2, 3, 1, 3, 4, 4, 2, 3, 3]],
		['card-c', 0.8, [1, 1, 2, 3, 3, 3, 3, 1, 3, 4]],
		['card-d', 0.95, [2, 3, 3, 3, 2, 2, 3, 4, 4, 4]]
	] as const)(
		'%s at retention %f matches ts-fsrs 5.4.2 fsrs().next review by review, fuzz on',
		(cardId, retention, grades) => {
			const ours = run(cardId, [...grades] as GradeValue[], { desiredRetention: retention }).map(
				(s) => serializeState(s.after)
			);
			const theirs = direct(cardId, [...grades] as Grade[], retention).map((c) =>
				serializeState(fromFsrsCard(c))
			);
			expect(ours).toEqual(theirs);
		}
	);

	it('fuzz is seeded by the card: the same card repeats, other cards spread', () => {
		const grades = [3, 3, 3, 3, 3, 3] as GradeValue[];
		const once = run('card-x', grades).map((s) => s.after.scheduledDays);
		expect(run('card-x', grades).map((s) => s.after.scheduledDays)).toEqual(once);
		const others = new Set(
			['a', 'b', 'c', 'd', 'e', 'f', 'g', 'h'].map(
				(id) => run(id, grades).at(-1)!.after.scheduledDays
			)
		);
		expect(others.size).toBeGreaterThan(1);
		expect(createScheduler(0.9).parameters.enable_fuzz).toBe(true);
		expect(createScheduler(0.9).parameters.learning_steps).toEqual(['1m', '10m']);
	});

	it('a lower desired retention gives longer intervals', () => {
		const at = (r: number) =>
			run('card-r', [3, 3, 3, 3], { desiredRetention: r, fuzz: false }).at(-1)!.after.scheduledDays;
		expect(at(0.8)).toBeGreaterThan(at(0.9));
		expect(at(0.9)).toBeGreaterThan(at(0.95));
	});
});

describe('undo', () => {
	it.each([
		[[3, 3, 3, 3, 3, 3, 1, 1, 3, 3, 3, 3, 3]],
		[[1, 2, 3, 4, 1, 4, 2, 2, 3]],
		[[4, 4, 4, 1, 1, 1, 3]]
	] as const)('rollback restores every state of %j byte for byte', (grades) => {
		for (const step of run('card-u', [...grades] as GradeValue[])) {
			expect(serializeState(undoGrade('card-u', step.result))).toBe(serializeState(step.before));
		}
	});
});

describe('previews', () => {
	it('shows for each grade the due the grade itself would give', () => {
		const s = run('card-p', [3, 3, 3]).at(-1)!.after;
		const now = s.due;
		const preview = previewDue('card-p', s, now);
		for (const g of [1, 2, 3, 4] as const) {
			expect(preview[g].toISOString()).toBe(gradeCard('card-p', s, g, now).after.due.toISOString());
		}
		expect(preview[1].getTime()).toBeLessThan(preview[3].getTime());
		expect(preview[3].getTime()).toBeLessThanOrEqual(preview[4].getTime());
	});

	it('refuses a grade outside 1–4', () => {
		expect(() => gradeCard('c', newSchedulingState(T0), 5 as GradeValue, T0)).toThrow(/Grade 5/);
	});
});
