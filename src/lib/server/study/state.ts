/**
 * A card's stored state as plain values and as the exact text kept in `reviews.state_before` and
 * `state_after`: fixed field order and ISO times, so that undo can restore and compare it byte
 * for byte.
 */
import type { Card } from '../db/models/index';
import type { CardState } from '../../practice/api';
import type { SchedulingState } from '../../practice/scheduler';

/** The fields undo restores, in the order they are written. */
const FIELDS = [
	'due',
	'stability',
	'difficulty',
	'scheduledDays',
	'learningSteps',
	'reps',
	'lapses',
	'state',
	'lastReview',
	'tempo',
	'introducedDay'
] as const satisfies readonly (keyof CardState)[];

const iso = (d: Date | string | null | undefined): string | null =>
	d === null || d === undefined ? null : new Date(d).toISOString();

/** The stored state of a card row. */
export function cardStateOf(row: Card): CardState {
	return {
		due: iso(row.due)!,
		stability: row.stability,
		difficulty: row.difficulty,
		scheduledDays: row.scheduledDays,
		learningSteps: row.learningSteps,
		reps: row.reps,
		lapses: row.lapses,
		state: row.state,
		lastReview: iso(row.lastReview),
		tempo: row.tempo ?? null,
		introducedDay: row.introducedDay ?? null
	};
}

/** The state as stored text, with the card's version after the write. */
export function serializeCardState(state: CardState, version: number): string {
	const out: Record<string, unknown> = {};
	for (const f of FIELDS) out[f] = state[f];
	out.version = version;
	return JSON.stringify(out);
}

/** Stored text back to a state and its version; throws on text we did not write. */
export function parseCardState(text: string): { state: CardState; version: number } {
	const raw = JSON.parse(text) as Record<string, unknown>;
	const state = {} as Record<string, unknown>;
	for (const f of FIELDS) {
		if (!(f in raw)) throw new Error(`Stored card state lacks “${f}”.`);
		state[f] = raw[f];
	}
	return { state: state as unknown as CardState, version: Number(raw.version) };
}

/** The column values that put a card into `state` (for `Card.update`). */
export function cardColumns(state: CardState) {
	return {
		due: new Date(state.due),
		stability: state.stability,
		difficulty: state.difficulty,
		scheduledDays: state.scheduledDays,
		learningSteps: state.learningSteps,
		reps: state.reps,
		lapses: state.lapses,
		state: state.state,
		lastReview: state.lastReview === null ? null : new Date(state.lastReview),
		tempo: state.tempo,
		introducedDay: state.introducedDay
	};
}

/** The scheduler's view of a stored state. */
export function schedulingOf(state: CardState): SchedulingState {
	return {
		due: new Date(state.due),
		stability: state.stability,
		difficulty: state.difficulty,
		scheduledDays: state.scheduledDays,
		learningSteps: state.learningSteps,
		reps: state.reps,
		lapses: state.lapses,
		state: state.state,
		lastReview: state.lastReview === null ? null : new Date(state.lastReview)
	};
}
