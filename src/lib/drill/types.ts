/**
 * The drill's JSON as the browser uses it: the server's contract (`$lib/practice/api`) under the
 * names the drill screen reads, plus the body of a review, which the browser writes.
 */
import type { GradeValue, ReviewAnswer, TodayAnswer, TodayItem } from '$lib/practice/api';

export type { ReviewAnswer, TodayAnswer, TodayItem };

/** Self-grades, worst to best (ts-fsrs Rating 1..4). */
export type Grade = GradeValue;
export const GRADES: readonly Grade[] = [1, 2, 3, 4];

/** What `POST /api/drill/reviews` sends. */
export interface ReviewBody {
	cardId: string;
	/** Concert key played. */
	key: string;
	quality: string;
	grade: Grade;
	/** Tempo played (quarter notes a minute). */
	tempo?: number;
	/** Milliseconds from the prompt to the reveal, and from the reveal to the grade. */
	revealMs?: number;
	gradeMs?: number;
	/** Made by the browser; the same id twice is one review. */
	clientId: string;
	/** When the grade was given (ISO), kept through any wait in the outbox. */
	reviewedAt: string;
	sittingId?: string;
}
