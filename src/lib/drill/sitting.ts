/**
 * A sitting in the browser: today's prompts in order, one at a time. A new lick is taught first
 * and comes back for recall a few prompts later; a lick whose next due time falls within the
 * sitting (ts-fsrs short-term steps after a miss) comes back the same way; undo goes back one
 * prompt and takes back whatever it had put into the queue. Pure: every function returns a new
 * sitting, and times are passed in, so the whole thing can be stored as JSON and tested.
 */
import type { Grade, ReviewAnswer, TodayItem } from './types';

export type StepMode = 'teach' | 'recall';

/** One prompt of the sitting. */
export interface Step {
	/** Unique in the sitting: the card and how many times it has come round. */
	id: string;
	item: TodayItem;
	/** `teach` shows notation and sound without a grade; `recall` asks to play from memory. */
	mode: StepMode;
	/** 0 the first time the card comes up in this sitting, 1 the next… */
	pass: number;
}

/** What was done at one step, newest last; undo pops it. */
export interface SittingEntry {
	stepId: string;
	kind: 'taught' | 'graded';
	/** When it was done (ISO). */
	at: string;
	grade?: Grade;
	/** The review's client id (graded steps). */
	clientId?: string;
	/** Concert key and tempo played (graded steps). */
	key?: string;
	tempo?: number;
	/** The step this one put back into the queue, if any. */
	insertedStepId?: string;
	/** The server's answer once it has arrived. */
	answer?: ReviewAnswer;
}

export interface Sitting {
	steps: Step[];
	/** Index of the current step; `steps.length` once every prompt is done. */
	position: number;
	log: SittingEntry[];
}

/** Prompts between a step and its return: long enough to be recall, not echo. */
export const RETURN_GAP = 3;
/** A card comes round at most this many times in one sitting; then it waits for its due time. */
export const MAX_PASSES = 4;
/** A card whose next due time is within this many minutes comes back in this sitting. */
export const RETURN_WITHIN_MINUTES = 60;

/**
 * A sitting over today's items, in the order the server gave them.
 * @example startSitting([item]).steps[0].mode // 'teach' for a new lick, else 'recall'
 */
export function startSitting(items: readonly TodayItem[]): Sitting {
	const seen = new Set<string>();
	const steps: Step[] = [];
	for (const item of items) {
		// A card listed twice would make two steps with one id: keep the first.
		if (seen.has(item.cardId)) continue;
		seen.add(item.cardId);
		steps.push({
			id: stepId(item.cardId, 0),
			item,
			mode: item.isNew ? 'teach' : 'recall',
			pass: 0
		});
	}
	return { steps, position: 0, log: [] };
}

function stepId(cardId: string, pass: number): string {
	return `${cardId}:${pass}`;
}

/** @example currentStep(startSitting([])) // null */
export function currentStep(sitting: Sitting): Step | null {
	return sitting.steps[sitting.position] ?? null;
}

/** @example isFinished(startSitting([])) // true */
export function isFinished(sitting: Sitting): boolean {
	return sitting.position >= sitting.steps.length;
}

/**
 * Prompts done and prompts in the sitting so far (returns add to both as they are queued).
 * @example progressOf(startSitting([a, b])) // { done: 0, total: 2 }
 */
export function progressOf(sitting: Sitting): { done: number; total: number } {
	return { done: Math.min(sitting.position, sitting.steps.length), total: sitting.steps.length };
}

function insertReturn(sitting: Sitting, step: Step): { steps: Step[]; id: string } {
	const steps = [...sitting.steps];
	const at = Math.min(sitting.position + 1 + RETURN_GAP, steps.length);
	steps.splice(at, 0, step);
	return { steps, id: step.id };
}

/**
 * The learner has seen and heard a new lick: it comes back for recall a few prompts later.
 * @example finishTeaching(sitting, '2026-03-01T19:00:00Z').steps // the recall step inserted
 */
export function finishTeaching(sitting: Sitting, at: string): Sitting {
	const step = currentStep(sitting);
	if (!step || step.mode !== 'teach') {
		throw new SittingError('finishTeaching needs a teaching step as the current step.');
	}
	const recall: Step = {
		id: stepId(step.item.cardId, step.pass + 1),
		item: step.item,
		mode: 'recall',
		pass: step.pass + 1
	};
	const { steps, id } = insertReturn(sitting, recall);
	return {
		steps,
		position: sitting.position + 1,
		log: [...sitting.log, { stepId: step.id, kind: 'taught', at, insertedStepId: id }]
	};
}

/**
 * Whether a grade brings the card back within this sitting: its preview for that grade falls
 * within the next hour (a short-term step), and it has not come round too often already.
 * Unknown previews (none sent) bring back a miss only.
 * @example comesBack(step, 1, new Date('2026-03-01T19:00:00Z')) // true when previews['1'] is 1 minute later
 */
export function comesBack(step: Step, grade: Grade, now: Date): boolean {
	if (step.pass + 1 >= MAX_PASSES) return false;
	const preview = step.item.previews?.[grade];
	if (!preview) return grade === 1;
	const due = Date.parse(preview);
	if (Number.isNaN(due)) return grade === 1;
	return due - now.getTime() <= RETURN_WITHIN_MINUTES * 60_000;
}

export interface GradeInput {
	grade: Grade;
	clientId: string;
	/** Tempo the learner played at. */
	tempo: number;
	at: Date;
}

/**
 * Record a grade for the current recall step and move on; a card due again within the sitting
 * is put back a few prompts later, at the tempo just played, its previews unknown until the
 * server's answer arrives (`applyAnswer`).
 * @example recordGrade(sitting, { grade: 3, clientId: 'c1', tempo: 120, at: now }).position // one further
 */
export function recordGrade(sitting: Sitting, input: GradeInput): Sitting {
	const step = currentStep(sitting);
	if (!step || step.mode !== 'recall') {
		throw new SittingError('recordGrade needs a recall step as the current step.');
	}
	const entry: SittingEntry = {
		stepId: step.id,
		kind: 'graded',
		at: input.at.toISOString(),
		grade: input.grade,
		clientId: input.clientId,
		key: step.item.key,
		tempo: input.tempo
	};
	let steps = sitting.steps;
	if (comesBack(step, input.grade, input.at)) {
		const again: Step = {
			id: stepId(step.item.cardId, step.pass + 1),
			// Previews unknown until the server answers: the grade buttons show no times meanwhile.
			item: {
				...step.item,
				tempo: input.tempo,
				isNew: false,
				previews: {} as TodayItem['previews']
			},
			mode: 'recall',
			pass: step.pass + 1
		};
		const inserted = insertReturn(sitting, again);
		steps = inserted.steps;
		entry.insertedStepId = inserted.id;
	}
	return { steps, position: sitting.position + 1, log: [...sitting.log, entry] };
}

/**
 * Take the server's answer to a review into the sitting. It is kept on the review's log entry (for
 * the summary), and it settles whether the card comes back today: the server's `again` prompt
 * (its previews, key and tempo) replaces the guess made when the grade was given, a return the
 * server does not ask for is taken out, and one it asks for is put in. Steps already passed are
 * left alone, and so is the current one unless `keepCurrent` is false (the learner has only just
 * come to it); an answer for an undone or unknown review changes nothing.
 * @example applyAnswer(sitting, 'c1', answer).log.at(-1)?.answer === answer // true
 */
export function applyAnswer(
	sitting: Sitting,
	clientId: string,
	answer: ReviewAnswer,
	options: { keepCurrent?: boolean } = {}
): Sitting {
	const keepCurrent = options.keepCurrent ?? true;
	const index = sitting.log.findIndex((e) => e.clientId === clientId);
	if (index < 0) return sitting;
	const entry: SittingEntry = { ...sitting.log[index], answer };
	const log = [...sitting.log];
	log[index] = entry;
	const graded = sitting.steps.find((s) => s.id === entry.stepId);
	const returning = entry.insertedStepId
		? sitting.steps.findIndex((s) => s.id === entry.insertedStepId)
		: -1;
	// The current prompt is changed only when the caller says the learner has not begun on it.
	const reached = keepCurrent ? returning <= sitting.position : returning < sitting.position;
	if (!graded || (returning >= 0 && reached)) {
		return { ...sitting, log };
	}
	let steps = sitting.steps;
	if (answer.again && graded.pass + 1 < MAX_PASSES) {
		const again: Step = {
			id: stepId(graded.item.cardId, graded.pass + 1),
			item: answer.again,
			mode: 'recall',
			pass: graded.pass + 1
		};
		if (returning >= 0) {
			steps = [...steps];
			steps[returning] = again;
		} else {
			steps = insertReturn({ ...sitting, steps }, again).steps;
			entry.insertedStepId = again.id;
		}
	} else if (returning >= 0 && !stillDueInSitting(answer, entry)) {
		steps = steps.filter((_, i) => i !== returning);
		delete entry.insertedStepId;
	}
	return { ...sitting, steps, log };
}

/**
 * Whether the server's new card state brings it back within the sitting (a short-term step due
 * soon after the grade) although the answer carries no prompt for it: the server leaves `again`
 * out when its engine is busy, and the guessed return is kept then.
 */
function stillDueInSitting(answer: ReviewAnswer, entry: SittingEntry): boolean {
	const { state, due } = answer.card;
	if (state !== 1 && state !== 3) return false;
	return Date.parse(due) - Date.parse(entry.at) <= RETURN_WITHIN_MINUTES * 60_000;
}

/**
 * Go back one prompt: the last thing done is taken back, with the step it put into the queue.
 * The entry is returned so that the caller can take its review back from the server.
 * @example undoLast(sitting) // { sitting: …one step back…, entry: …the grade taken back… } or null
 */
export function undoLast(sitting: Sitting): { sitting: Sitting; entry: SittingEntry } | null {
	const entry = sitting.log.at(-1);
	if (!entry) return null;
	const position = sitting.steps.findIndex((s) => s.id === entry.stepId);
	if (position < 0) throw new SittingError(`The step ${entry.stepId} is missing from the sitting.`);
	const steps = entry.insertedStepId
		? sitting.steps.filter((s) => s.id !== entry.insertedStepId)
		: sitting.steps;
	return { sitting: { steps, position, log: sitting.log.slice(0, -1) }, entry };
}

export interface TempoGain {
	lickId: string;
	title: string;
	from: number;
	to: number;
}

export interface SittingSummary {
	/** Grades given (a lick graded twice counts twice). */
	reps: number;
	/** Licks taught for the first time. */
	taught: number;
	/** Whole minutes from the first prompt to the last grade, at least 1 once anything was done. */
	minutes: number;
	/** Concert keys played, in the order first played. */
	keys: string[];
	/** Licks whose tempo rung went up (or that were played faster with a good grade). */
	tempoGains: TempoGain[];
	/** Grades given, by grade. */
	byGrade: Record<Grade, number>;
}

/**
 * What the sitting did, for its closing screen.
 * @example summarise(sitting, startedAt).reps // 7
 */
export function summarise(sitting: Sitting, startedAt: Date): SittingSummary {
	const byGrade: Record<Grade, number> = { 1: 0, 2: 0, 3: 0, 4: 0 };
	const keys: string[] = [];
	const start = new Map<string, { title: string; tempo: number }>();
	const best = new Map<string, number>();
	let reps = 0;
	let taught = 0;
	let last = startedAt.getTime();
	const stepsById = new Map(sitting.steps.map((s) => [s.id, s]));
	for (const step of sitting.steps) {
		if (!start.has(step.item.lickId)) {
			start.set(step.item.lickId, { title: step.item.title, tempo: step.item.tempo });
		}
	}
	for (const entry of sitting.log) {
		last = Math.max(last, Date.parse(entry.at));
		if (entry.kind === 'taught') {
			taught++;
			continue;
		}
		reps++;
		if (entry.grade) byGrade[entry.grade]++;
		if (entry.key && !keys.includes(entry.key)) keys.push(entry.key);
		const lickId = stepsById.get(entry.stepId)?.item.lickId;
		if (!lickId) continue;
		// The server's rung after the review when it said; otherwise a tempo played with a good grade.
		const reached =
			entry.answer?.card.tempo ?? (entry.grade && entry.grade >= 3 ? entry.tempo : undefined);
		if (reached != null) best.set(lickId, Math.max(best.get(lickId) ?? 0, reached));
	}
	const tempoGains: TempoGain[] = [];
	for (const [lickId, to] of best) {
		const from = start.get(lickId);
		if (from && to > from.tempo)
			tempoGains.push({ lickId, title: from.title, from: from.tempo, to });
	}
	const minutes =
		sitting.log.length === 0 ? 0 : Math.max(1, Math.round((last - startedAt.getTime()) / 60_000));
	return { reps, taught, minutes, keys, tempoGains, byGrade };
}

export class SittingError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'SittingError';
	}
}
