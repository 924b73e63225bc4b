/**
 * The drill's JSON, as the routes send it and the drill screen reads it. Types only (safe in the
 * browser): the server builds these in `$lib/server/study`, the client imports them from here.
 *
 * Times are ISO 8601 strings in UTC; days are the learner's practice days, 'YYYY-MM-DD' in their
 * time zone from their day-start hour (`practiceDay` in `./day`).
 */
import type { VariantSuccess } from '../music/engine';

/** The four self-grades, worst to best (ts-fsrs Rating 1–4). Their names live on the screen. */
export type GradeValue = 1 | 2 | 3 | 4;

/** Where a card stands (ts-fsrs State 0–3 by name). */
export type CardStateName = 'new' | 'learning' | 'review' | 'relearning';

/** The engine's answer for one key, quality and instrument: the same body as `/api/transpose`. */
export type PromptVariant = Omit<VariantSuccess, 'ok'>;

/** A comment a teacher left on the card, shown at the reveal. */
export interface CardComment {
	id: string;
	authorName: string;
	text: string;
	createdAt: string;
}

/** One prompt of today's queue. */
export interface TodayItem {
	cardId: string;
	lickId: string;
	title: string;
	/** Concert key tonic of this prompt ('Eb'), picked to cover all twelve over time. */
	key: string;
	/** The key as written for the learner's instrument (the variant's K: value, e.g. 'C' for Eb on alto). */
	writtenKey: string;
	/** Chord quality of this card ('7', 'm7', 'maj7', …). */
	quality: string;
	/** The lick's own quality; a card over another quality is a re-mapped line. */
	homeQuality: string;
	/** Instrument id the variant is written for (the learner's setting). */
	instrument: string;
	/** Tempo to start at (quarter notes a minute): the tempo ladder's rung. */
	tempo: number;
	/** Where the ladder climbs to: the assignment's target tempo, else the lick's. */
	targetTempo: number;
	/** Long:short ratio of paired eighths; 1 is straight. */
	swingRatio: number;
	/** The lick's own abc at concert pitch, as its author wrote it. */
	abc: string;
	/**
	 * The lick's teaching note (Markdown), its note and chord names moved into the written key
	 * of this prompt (see `noteNames`).
	 */
	note: string;
	/**
	 * How the note's names relate to the key shown: `moved` (every name moved), `some-moved`
	 * (names with an accidental or a chord suffix moved; single letters, which may be words,
	 * left as written in the lick's home key), `home` (only single letters, left in the home
	 * key), `none` (no note names, or the prompt is in the home key).
	 */
	noteNames: 'moved' | 'some-moved' | 'home' | 'none';
	/** True the first time the card comes up: teach it (notation and sound first), then grade. */
	isNew: boolean;
	state: CardStateName;
	/** When the card fell due. */
	due: string;
	/** Probability of recall now (0–1); null for a new card. */
	retrievability: number | null;
	/** When the card would come back after each grade, if graded now. */
	previews: Record<GradeValue, string>;
	/** Notation for this key, quality and instrument, so the prompt shows offline. */
	variant: PromptVariant;
	comments: CardComment[];
	/** The card's compare-and-set counter when the queue was built. */
	version: number;
}

/** `GET /api/drill/today`. */
export interface TodayAnswer {
	/** The practice day the queue is for. */
	day: string;
	/** When this practice day ends (the next one starts). */
	dayEndsAt: string;
	/** When the queue was built. */
	generatedAt: string;
	/** Due cards first (least likely remembered first), then new cards at their source's pace. */
	items: TodayItem[];
	counts: {
		/** Due cards in `items`. */
		due: number;
		/** New cards in `items`. */
		new: number;
		/** Minutes `items` should take, from the learner's own review times. */
		estimatedMinutes: number;
		/** Reviews already graded today (not undone). */
		doneToday: number;
	};
	backlog: {
		/** Cards due today or earlier, including those left for the coming days. */
		overdue: number;
		/** Days the catch-up takes at today's cap (0 when there is no backlog). */
		catchUpDays: number;
		/** Most due cards shown a day while catching up. */
		dailyCap: number;
	};
	/** The learner's practice budget and pace. */
	dailyMinutes: number;
}

/** The card's stored scheduling state, as saved before and after each review. */
export interface CardState {
	due: string;
	stability: number;
	difficulty: number;
	scheduledDays: number;
	learningSteps: number;
	reps: number;
	lapses: number;
	/** ts-fsrs State 0–3. */
	state: number;
	lastReview: string | null;
	/** Tempo ladder rung: the tempo the next prompt starts at; null before the first grade. */
	tempo: number | null;
	/** Day the card was first shown; null while new. */
	introducedDay: string | null;
}

/** One stored review. */
export interface ReviewRecord {
	id: string;
	cardId: string;
	clientId: string;
	sittingId: string | null;
	reviewedAt: string;
	day: string;
	grade: GradeValue;
	key: string;
	quality: string;
	tempo: number | null;
	revealMs: number | null;
	gradeMs: number | null;
	undoneAt: string | null;
}

/**
 * `POST /api/drill/reviews` (201 first time, 200 for a resend of the same clientId) and
 * `DELETE /api/drill/reviews/[id]` (200).
 */
export interface ReviewAnswer {
	review: ReviewRecord;
	/** The card after this review (after an undo: as it was before it). */
	card: CardState & { id: string; version: number; stateName: CardStateName };
	/** True when this clientId had been recorded already: nothing new was written. */
	duplicate: boolean;
	/**
	 * The card's next prompt when it comes back within today's practice day (a learning step:
	 * a line failed now returns later in the sitting); null otherwise or after an undo.
	 */
	again: TodayItem | null;
}

/** `GET /api/cards/[id]`. */
export interface CardAnswer {
	card: CardState & {
		id: string;
		version: number;
		stateName: CardStateName;
		userId: string;
		lickId: string;
		title: string;
		quality: string;
		assignmentId: string | null;
		retiredAt: string | null;
		retrievability: number | null;
	};
	/** Newest first, undone ones included (marked). */
	reviews: ReviewRecord[];
}

/** `POST /api/cards`. */
export interface AddCardsAnswer {
	/** Cards created now. */
	created: number;
	/** Cards the learner already had (left as they were). */
	existing: number;
	cardIds: string[];
}

/** `GET /api/drill/progress`. */
export interface ProgressAnswer {
	today: string;
	/** Days in a row with at least one review, ending today (or yesterday if today is still open). */
	streak: { current: number; longest: number };
	/** Last 365 practice days with reviews: day → reviews that day (undone ones left out). */
	calendar: { day: string; reviews: number }[];
	/** Reviews per day over the last 30 days (zeros included), oldest first. */
	reviewsPerDay: { day: string; reviews: number; passed: number }[];
	/** Share of reviews passed (grade ≥ 2) against the target, by maturity of the card at review. */
	retention: {
		target: number;
		byMaturity: {
			/** 'learning' (new or relearning), 'young' (interval < 21 days), 'mature' (≥ 21 days). */
			maturity: 'learning' | 'young' | 'mature';
			reviews: number;
			passed: number;
			/** passed / reviews, null when there are none. */
			rate: number | null;
		}[];
	};
	/** Per concert key: how well it goes (mean grade mapped to 0–1) over the last 90 days. */
	keys: { key: string; reviews: number; strength: number | null; lastDay: string | null }[];
	/** Tempo ladder per lick: the best rung of its cards against the target. */
	tempos: { lickId: string; title: string; tempo: number | null; targetTempo: number }[];
	/** Cards due on each of the next 14 practice days (today first, overdue counted today). */
	forecast: { day: string; due: number }[];
	cards: { total: number; new: number; learning: number; review: number };
}
