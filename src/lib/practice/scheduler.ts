/**
 * Scheduling, in one place: ts-fsrs 5 with the learner's desired retention, short-term learning
 * steps (a line failed now returns within the sitting), fuzz seeded by the card (so a run
 * repeats), `rollback` for undo and the forgetting curve for ordering by risk. The time is always
 * passed in. Load balancing and sibling spreading (`./balance`) choose a day within the fuzz range
 * through the `pickDays` hook.
 */
import {
	createEmptyCard,
	forgetting_curve,
	fsrs,
	generatorParameters,
	get_fuzz_range,
	GenSeedStrategyWithCardId,
	State,
	StrategyMode,
	type Card as FsrsCard,
	type FSRS,
	type FSRSParameters,
	type Grade,
	type ReviewLog
} from 'ts-fsrs';
import type { CardStateName, GradeValue } from './api';

/**
 * Every scheduler parameter besides the learner's retention. The 21 weights are ts-fsrs'
 * FSRS-6 defaults until a learner has enough reviews to fit their own.
 */
export const SCHEDULER_PARAMETERS: Readonly<Omit<FSRSParameters, 'request_retention' | 'w'>> =
	Object.freeze({
		maximum_interval: 36500,
		// Spreads cards graded together over neighbouring days; seeded by the card below.
		enable_fuzz: true,
		enable_short_term: true,
		// A new lick is shown, then asked again a minute and ten minutes later: within one sitting.
		learning_steps: ['1m', '10m'] as const,
		relearning_steps: ['10m'] as const
	});

/** The learner's retention when they chose none (ts-fsrs' own default). */
export const DEFAULT_RETENTION = 0.9;

/** The full parameter set for a desired retention (0.7–0.99). */
export function schedulerParameters(desiredRetention = DEFAULT_RETENTION): FSRSParameters {
	if (!(desiredRetention > 0 && desiredRetention < 1)) {
		throw new RangeError(`Desired retention ${desiredRetention} is outside (0, 1).`);
	}
	return generatorParameters({ ...SCHEDULER_PARAMETERS, request_retention: desiredRetention });
}

/** The field of a ts-fsrs card that carries our card id into the fuzz seed. */
const SEED_FIELD = 'cardId';

const schedulers = new Map<string, FSRS>();

/**
 * The ts-fsrs scheduler for a retention (cached), fuzz seeded by card id and repetition count.
 * @example createScheduler(0.9).parameters.enable_fuzz // true
 */
export function createScheduler(desiredRetention = DEFAULT_RETENTION, fuzz = true): FSRS {
	const key = `${desiredRetention}|${fuzz}`;
	let f = schedulers.get(key);
	if (!f) {
		f = fsrs({ ...schedulerParameters(desiredRetention), enable_fuzz: fuzz }).useStrategy(
			StrategyMode.SEED,
			GenSeedStrategyWithCardId(SEED_FIELD)
		);
		schedulers.set(key, f);
	}
	return f;
}

/** A card's scheduling state as we store it (ts-fsrs Card without the deprecated elapsed_days). */
export interface SchedulingState {
	due: Date;
	stability: number;
	difficulty: number;
	scheduledDays: number;
	learningSteps: number;
	reps: number;
	lapses: number;
	/** ts-fsrs State: 0 new, 1 learning, 2 review, 3 relearning. */
	state: number;
	lastReview: Date | null;
}

/**
 * A new card's state, due at `now`.
 * @example newSchedulingState(new Date(0)).state // 0
 */
export function newSchedulingState(now: Date): SchedulingState {
	return fromFsrsCard(createEmptyCard(now));
}

/** ts-fsrs' card from ours, with the id that seeds the fuzz. */
export function toFsrsCard(id: string, s: SchedulingState): FsrsCard & { cardId: string } {
	return {
		cardId: id,
		due: new Date(s.due.getTime()),
		stability: s.stability,
		difficulty: s.difficulty,
		elapsed_days: 0,
		scheduled_days: s.scheduledDays,
		learning_steps: s.learningSteps,
		reps: s.reps,
		lapses: s.lapses,
		state: s.state as State,
		last_review: s.lastReview ? new Date(s.lastReview.getTime()) : undefined
	};
}

/** Our state from ts-fsrs' card. */
export function fromFsrsCard(c: FsrsCard): SchedulingState {
	return {
		due: new Date(c.due.getTime()),
		stability: c.stability,
		difficulty: c.difficulty,
		scheduledDays: c.scheduled_days,
		learningSteps: c.learning_steps,
		reps: c.reps,
		lapses: c.lapses,
		state: c.state,
		lastReview: c.last_review ? new Date(c.last_review.getTime()) : null
	};
}

const STATE_NAMES: readonly CardStateName[] = ['new', 'learning', 'review', 'relearning'];

/** @example stateName(2) // 'review' */
export function stateName(state: number): CardStateName {
	return STATE_NAMES[state] ?? 'new';
}

const DAY_MS = 86_400_000;

/**
 * Probability of recall at `now` (0–1) from the forgetting curve with fractional days, so that
 * cards graded the same day still order by risk; null for a new card.
 * @example retrievability({ ...s, stability: 1, lastReview: t0, state: 2 }, t0 + 1 day) // 0.9
 */
export function retrievability(
	s: SchedulingState,
	now: Date,
	desiredRetention = DEFAULT_RETENTION
): number | null {
	if (s.state === State.New || !s.lastReview || !(s.stability > 0)) return null;
	const elapsed = Math.max(0, (now.getTime() - s.lastReview.getTime()) / DAY_MS);
	return forgetting_curve(createScheduler(desiredRetention).parameters.w, elapsed, s.stability);
}

/** The range of whole days within which a review interval may land, and ts-fsrs' own pick. */
export interface DayRange {
	min: number;
	max: number;
	/** The interval ts-fsrs chose (fuzzed, seeded by the card). */
	fuzzed: number;
}

export interface GradeOptions {
	desiredRetention?: number;
	/** Fuzz on (the default); off only to compare with published fixed sequences. */
	fuzz?: boolean;
	/**
	 * Chooses the interval in days within the fuzz range (load balancing, sibling spreading).
	 * Without it ts-fsrs' seeded fuzz decides.
	 */
	pickDays?: (range: DayRange, now: Date) => number;
}

export interface GradeResult {
	before: SchedulingState;
	after: SchedulingState;
	/** ts-fsrs' review log, what `rollback` needs. */
	log: ReviewLog;
}

/**
 * Grade a card at `now`: ts-fsrs' next state, with the interval moved within the fuzz range when
 * `pickDays` is given.
 * @example gradeCard('c1', newSchedulingState(t), 3, t).after.state // 1 (learning)
 */
export function gradeCard(
	cardId: string,
	before: SchedulingState,
	grade: GradeValue,
	now: Date,
	options: GradeOptions = {}
): GradeResult {
	if (![1, 2, 3, 4].includes(grade)) throw new RangeError(`Grade ${grade} is not 1–4.`);
	const retention = options.desiredRetention ?? DEFAULT_RETENTION;
	const f = createScheduler(retention, options.fuzz ?? true);
	const { card, log } = f.next(toFsrsCard(cardId, before), now, grade as Grade);
	let after = fromFsrsCard(card);
	if (options.pickDays && after.state === State.Review && after.scheduledDays >= 1) {
		const range = fuzzRange(before, after, now, retention);
		// The picker may step a day outside the fuzz range to keep siblings apart (`./balance`).
		const days = clampInt(
			options.pickDays(range, now),
			Math.max(1, range.min - 1),
			Math.min(f.parameters.maximum_interval, range.max + 1)
		);
		if (days !== after.scheduledDays) {
			after = { ...after, scheduledDays: days, due: new Date(now.getTime() + days * DAY_MS) };
		}
	}
	return { before, after, log };
}

function clampInt(n: number, min: number, max: number): number {
	return Math.min(max, Math.max(min, Math.round(n)));
}

/**
 * Where ts-fsrs' fuzz could have put a review interval: the unfuzzed interval for the new
 * stability and ts-fsrs' `get_fuzz_range` around it (a single day below 2.5 days, as ts-fsrs).
 */
export function fuzzRange(
	before: SchedulingState,
	after: SchedulingState,
	now: Date,
	desiredRetention = DEFAULT_RETENTION
): DayRange {
	const plain = createScheduler(desiredRetention, false);
	const elapsed =
		before.state !== State.New && before.lastReview
			? Math.floor((now.getTime() - before.lastReview.getTime()) / DAY_MS)
			: 0;
	const interval = plain.next_interval(after.stability, elapsed);
	if (interval < 2.5) return { min: interval, max: interval, fuzzed: after.scheduledDays };
	const { min_ivl, max_ivl } = get_fuzz_range(interval, elapsed, plain.parameters.maximum_interval);
	return {
		min: Math.min(min_ivl, after.scheduledDays),
		max: Math.max(max_ivl, after.scheduledDays),
		fuzzed: after.scheduledDays
	};
}

/**
 * When the card would come back after each grade, if graded at `now` (for the buttons).
 * @example previewDue('c1', newSchedulingState(t), t)[4] // t + 8 days
 */
export function previewDue(
	cardId: string,
	s: SchedulingState,
	now: Date,
	options: GradeOptions = {}
): Record<GradeValue, Date> {
	return {
		1: gradeCard(cardId, s, 1, now, options).after.due,
		2: gradeCard(cardId, s, 2, now, options).after.due,
		3: gradeCard(cardId, s, 3, now, options).after.due,
		4: gradeCard(cardId, s, 4, now, options).after.due
	};
}

/**
 * Undo a grade with ts-fsrs' `rollback`. ts-fsrs restores the memory state and counts but puts
 * `due` at the review time; the exact due from before the grade is taken from `before` (which
 * the review log keeps), so the card comes back byte for byte.
 * @example undoGrade('c1', gradeCard('c1', s, 3, t)).due // s.due
 */
export function undoGrade(cardId: string, result: GradeResult): SchedulingState {
	const f = createScheduler(DEFAULT_RETENTION);
	const rolled = fromFsrsCard(f.rollback(toFsrsCard(cardId, result.after), result.log));
	return { ...rolled, due: new Date(result.before.due.getTime()) };
}

/**
 * The state as stored text: the same state always gives the same bytes (fixed field order,
 * ISO times), so a restore can be compared byte for byte.
 */
export function serializeState(s: SchedulingState): string {
	return JSON.stringify({
		due: s.due.toISOString(),
		stability: s.stability,
		difficulty: s.difficulty,
		scheduledDays: s.scheduledDays,
		learningSteps: s.learningSteps,
		reps: s.reps,
		lapses: s.lapses,
		state: s.state,
		lastReview: s.lastReview ? s.lastReview.toISOString() : null
	});
}
