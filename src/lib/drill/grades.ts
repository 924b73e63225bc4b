/**
 * The four self-grades as the learner sees them: our own names and colours, worst to best. The
 * number is the ts-fsrs rating sent to the server and the key that gives the grade.
 */
import type { Grade } from './types';

export interface GradeLabel {
	grade: Grade;
	name: string;
	/** What the grade means, for the button's description. */
	meaning: string;
	/** Button colours (Tailwind classes), a ramp from sand through teal to brass. */
	tone: string;
}

export const GRADE_LABELS: readonly GradeLabel[] = [
	{
		grade: 1,
		name: 'Dropped',
		meaning: 'It would not come from memory',
		tone: 'bg-paper-200 text-ink-950 border-ink-800/35 hover:border-ink-800 dark:bg-paper-200 dark:text-ink-950'
	},
	{
		grade: 2,
		name: 'Shaky',
		meaning: 'It came, with stumbles or gaps',
		tone: 'bg-ink-100 text-ink-950 border-ink-300 hover:border-ink-600 dark:bg-ink-200 dark:text-ink-950'
	},
	{
		grade: 3,
		name: 'Solid',
		meaning: 'Played through, with some thought',
		tone: 'bg-ink-700 text-paper-50 border-ink-700 hover:bg-ink-800 dark:bg-ink-500 dark:border-ink-400'
	},
	{
		grade: 4,
		name: 'Nailed',
		meaning: 'It came out without thinking, at tempo',
		tone: 'bg-brass-400 text-ink-950 border-brass-500 hover:bg-brass-300'
	}
];

/** @example gradeName(3) // 'Solid' */
export function gradeName(grade: Grade): string {
	return GRADE_LABELS[grade - 1]?.name ?? String(grade);
}
