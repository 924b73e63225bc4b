/**
 * The drill's JSON as the browser receives it from `GET /api/drill/today` and
 * `POST /api/drill/reviews`. One shape, shared by the drill screen, the offline outbox and their
 * tests.
 */
import type { VariantSuccess } from '$lib/music';

/** Self-grades, worst to best (ts-fsrs Rating 1..4). */
export type Grade = 1 | 2 | 3 | 4;
export const GRADES: readonly Grade[] = [1, 2, 3, 4];

/** A variant as `POST /api/transpose` answers it: the engine's result without its `ok`. */
export type DrillVariant = Omit<VariantSuccess, 'ok'>;

/** One prompt of today's queue. */
export interface DrillItem {
	cardId: string;
	lickId: string;
	title: string;
	/** Concert key tonic of the prompt, e.g. `Eb`. */
	key: string;
	/** The key as written for the learner's instrument (`F` for a B♭ trumpet in E♭). */
	writtenKey: string;
	/** Chord quality the lick is played over (`7`, `m7`…). */
	quality: string;
	instrument: string;
	/** Tempo to start at: where the lick was last played well. */
	tempo: number;
	targetTempo: number;
	swingRatio: number;
	/** The lick's abc at concert pitch in its home key. */
	abc: string;
	/** First time this card comes up: taught before it is tested. */
	isNew: boolean;
	/** When the card comes back after each grade (ISO instants). */
	previews: Partial<Record<`${Grade}`, string>>;
	/** The lick in this key and quality, written for the learner's instrument. */
	variant: DrillVariant;
	/** A teacher's comments on the card, newest first. */
	comments?: { text: string; author?: string; at?: string }[];
	/** The lick's teaching note, offered as a hint. */
	hint?: string | null;
}

export interface DrillToday {
	/** The learner's practice day, `YYYY-MM-DD`. */
	day: string;
	items: DrillItem[];
	counts: { due: number; new: number; total?: number; [k: string]: number | undefined };
	/** Overdue cards left for later days, and how many days the catch-up takes. */
	backlog: { cards: number; days: number } | number | null;
}

/** What `POST /api/drill/reviews` sends. */
export interface ReviewBody {
	cardId: string;
	key: string;
	quality: string;
	grade: Grade;
	tempo?: number;
	revealMs?: number;
	gradeMs?: number;
	clientId: string;
	/** When the grade was given (ISO), kept through any wait in the outbox. */
	reviewedAt: string;
	sittingId?: string;
}

/** What the drill needs from the answer to a review. */
export interface ReviewAnswer {
	/** Id for `DELETE /api/drill/reviews/[id]`. */
	reviewId: string;
	/** When the card is due next (ISO). */
	due: string;
	/** The card's tempo rung after this review, when the answer says. */
	tempo?: number;
	/** Next previews, for a card that comes back within the sitting. */
	previews?: Partial<Record<`${Grade}`, string>>;
}
