/**
 * The tempo ladder. A card keeps one rung: the tempo its next prompt starts at, which is the
 * tempo it was last played well (raised a step after a top grade). A top grade at the rung moves
 * it a step toward the target, and past the target to a stretch tempo once the target itself was
 * held; a failure moves it a step back. Tempos are quarter notes a minute. Pure.
 */
import type { GradeValue } from './api';

/** How far past the target the ladder goes once the target is held. */
export const STRETCH_FACTOR = 1.1;
/** Where a card starts before it was ever graded: a little under the target (common practice). */
export const START_FACTOR = 0.8;
/** Never step below half the target, nor below 30. */
export const FLOOR_FACTOR = 0.5;

/** @example tempoStep(160) // 8 */
export function tempoStep(target: number): number {
	return Math.max(2, Math.round(target * 0.05));
}

/** @example stretchTempo(160) // 176 */
export function stretchTempo(target: number): number {
	return Math.round(target * STRETCH_FACTOR);
}

/** @example floorTempo(160) // 80 */
export function floorTempo(target: number): number {
	return Math.max(30, Math.round(target * FLOOR_FACTOR));
}

/**
 * The tempo a prompt starts at.
 * @example promptTempo(null, 160) // 128
 */
export function promptTempo(rung: number | null, target: number): number {
	if (rung !== null && Number.isFinite(rung)) return rung;
	return Math.max(floorTempo(target), Math.round(target * START_FACTOR));
}

/**
 * The rung after a grade at the tempo actually `played`.
 * @example nextRung({ rung: 120, played: 120, grade: 4, target: 160 }) // 128
 */
export function nextRung(input: {
	rung: number | null;
	played: number;
	grade: GradeValue;
	target: number;
}): number {
	const { played, grade, target } = input;
	const rung = promptTempo(input.rung, target);
	const step = tempoStep(target);
	const top = stretchTempo(target);
	switch (grade) {
		case 4: {
			// Toward the target; past it only from a top grade at (or above) the target.
			const ceiling = played >= target ? top : target;
			return Math.max(rung, Math.min(ceiling, played + step));
		}
		case 3:
			// Played well: the rung follows a faster tempo the learner chose, never a slower one.
			return Math.max(rung, Math.min(top, played));
		case 2:
			return rung;
		case 1:
			return Math.max(floorTempo(target), Math.min(rung, played) - step);
	}
}
