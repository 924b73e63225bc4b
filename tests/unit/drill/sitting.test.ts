import { describe, expect, it } from 'vitest';
import {
	applyAnswer,
	comesBack,
	currentStep,
	finishTeaching,
	isFinished,
	progressOf,
	recordGrade,
	RETURN_GAP,
	SittingError,
	startSitting,
	summarise,
	undoLast,
	type Sitting
} from '../../../src/lib/drill/sitting';
import type { Grade, TodayItem } from '../../../src/lib/drill/types';
import { answer, item } from './fixtures';

const now = new Date('2026-03-01T19:00:00Z');
const later = (minutes: number) => new Date(now.getTime() + minutes * 60_000).toISOString();

/** Previews as ts-fsrs gives a review card: a miss returns in 10 minutes, the rest in days. */
const reviewPreviews = {
	'1': later(10),
	'2': later(60 * 24 * 2),
	'3': later(60 * 24 * 5),
	'4': later(60 * 24 * 9)
};

const ids = (s: Sitting) => s.steps.map((st) => `${st.id}/${st.mode}`);

function grade(s: Sitting, g: Grade, clientId = `c${s.log.length + 1}`, tempo = 120): Sitting {
	return recordGrade(s, { grade: g, clientId, tempo, at: now });
}

describe('startSitting', () => {
	it('teaches new licks and asks for recall of known ones, in the order given, once per card', () => {
		const s = startSitting([item('a'), item('b', { isNew: true }), item('a'), item('c')]);
		expect(ids(s)).toEqual(['a:0/recall', 'b:0/teach', 'c:0/recall']);
		expect(progressOf(s)).toEqual({ done: 0, total: 3 });
		expect(isFinished(s)).toBe(false);
	});

	it('is finished at once without items', () => {
		const s = startSitting([]);
		expect(currentStep(s)).toBeNull();
		expect(isFinished(s)).toBe(true);
	});
});

describe('finishTeaching', () => {
	it('brings a taught lick back for recall after a few other prompts', () => {
		const s = finishTeaching(
			startSitting([item('n', { isNew: true }), item('a'), item('b'), item('c'), item('d')]),
			now.toISOString()
		);
		expect(ids(s)).toEqual([
			'n:0/teach',
			'a:0/recall',
			'b:0/recall',
			'c:0/recall',
			'n:1/recall',
			'd:0/recall'
		]);
		expect(s.steps.findIndex((x) => x.id === 'n:1')).toBe(RETURN_GAP + 1);
		expect(currentStep(s)?.id).toBe('a:0');
	});

	it('puts the recall at the end when fewer prompts remain than the gap', () => {
		const s = finishTeaching(
			startSitting([item('n', { isNew: true }), item('a')]),
			now.toISOString()
		);
		expect(ids(s)).toEqual(['n:0/teach', 'a:0/recall', 'n:1/recall']);
	});

	it('refuses a recall step', () => {
		expect(() => finishTeaching(startSitting([item('a')]), now.toISOString())).toThrow(
			SittingError
		);
	});
});

describe('recordGrade and comesBack', () => {
	it.each([
		// [grade, previews, comes back?]
		[1, reviewPreviews, true],
		[2, reviewPreviews, false],
		[3, reviewPreviews, false],
		[4, reviewPreviews, false],
		// A new card's learning steps (ts-fsrs 5.4.2 defaults: 1m, 10m): Good returns within the hour.
		[3, { '3': later(10) }, true],
		[1, {}, true],
		[3, {}, false],
		[1, { '1': 'not a date' }, true]
	] as const)('grade %d with previews %j brings the card back: %s', (g, previews, back) => {
		const s = startSitting([item('a', { previews: previews as TodayItem['previews'] })]);
		expect(comesBack(currentStep(s)!, g, now)).toBe(back);
		expect(grade(s, g).steps.length).toBe(back ? 2 : 1);
	});

	it('brings a missed card back at the tempo played, with previews unknown until the answer', () => {
		const s = grade(startSitting([item('a', { previews: reviewPreviews })]), 1, 'c1', 104);
		const back = s.steps[1];
		expect(back).toMatchObject({ id: 'a:1', mode: 'recall', pass: 1 });
		expect(back.item.tempo).toBe(104);
		expect(back.item.previews).toEqual({});
		expect(s.log[0]).toMatchObject({
			stepId: 'a:0',
			kind: 'graded',
			grade: 1,
			clientId: 'c1',
			key: 'C',
			tempo: 104,
			insertedStepId: 'a:1'
		});
	});

	it('stops bringing a card back after four passes in one sitting', () => {
		let s = startSitting([item('a')]);
		for (let i = 0; i < 10 && !isFinished(s); i++) s = grade(s, 1);
		expect(s.log.length).toBe(4);
		expect(isFinished(s)).toBe(true);
	});

	it('refuses to grade a teaching step', () => {
		expect(() => grade(startSitting([item('n', { isNew: true })]), 3)).toThrow(SittingError);
	});
});

describe('applyAnswer', () => {
	it("puts the server's again prompt in place of the guessed return", () => {
		const s = grade(startSitting([item('a', { previews: reviewPreviews }), item('b')]), 1, 'c1');
		const again = item('a', { key: 'Gb', tempo: 112, previews: reviewPreviews });
		const t = applyAnswer(s, 'c1', answer('r1', { again }));
		expect(t.log[0].answer?.review.id).toBe('r1');
		expect(ids(t)).toEqual(['a:0/recall', 'b:0/recall', 'a:1/recall']);
		expect(t.steps[2].item).toBe(again);
	});

	it('takes out a guessed return the server does not ask for, so undo has nothing left to take', () => {
		const s = grade(startSitting([item('a'), item('b')]), 1, 'c1');
		const t = applyAnswer(s, 'c1', answer('r1', { again: null }));
		expect(ids(t)).toEqual(['a:0/recall', 'b:0/recall']);
		expect(t.log[0].insertedStepId).toBeUndefined();
		expect(undoLast(t)!.sitting.steps).toHaveLength(2);
	});

	it('keeps the guessed return when the server says the card is due again soon but sends no prompt', () => {
		const s = grade(startSitting([item('a'), item('b')]), 1, 'c1');
		const soon = new Date(now.getTime() + 10 * 60_000).toISOString();
		const t = applyAnswer(s, 'c1', answer('r1', { again: null, state: 3, due: soon }));
		expect(ids(t)).toEqual(ids(s));
		expect(t.log[0].insertedStepId).toBe('a:1');
	});

	it('puts in a return the server asks for that the grade did not guess', () => {
		const s = grade(startSitting([item('a', { previews: reviewPreviews }), item('b')]), 3, 'c1');
		expect(s.steps).toHaveLength(2);
		const t = applyAnswer(s, 'c1', answer('r1', { again: item('a', { key: 'D' }) }));
		expect(ids(t)).toEqual(['a:0/recall', 'b:0/recall', 'a:1/recall']);
		expect(t.log[0].insertedStepId).toBe('a:1');
		expect(undoLast(t)!.sitting.steps).toHaveLength(2);
	});

	it('changes the current prompt only when told the learner has not begun on it', () => {
		const s = grade(startSitting([item('a')]), 1, 'c1');
		expect(currentStep(s)?.id).toBe('a:1');
		const again = item('a', { key: 'Ab' });
		expect(applyAnswer(s, 'c1', answer('r1', { again })).steps).toEqual(s.steps);
		const swapped = applyAnswer(s, 'c1', answer('r1', { again }), { keepCurrent: false });
		expect(currentStep(swapped)?.item.key).toBe('Ab');
	});

	it('leaves a return already passed as it is', () => {
		let s = grade(startSitting([item('a')]), 1, 'c1');
		expect(currentStep(s)?.id).toBe('a:1');
		s = grade(s, 3, 'c2');
		const t = applyAnswer(s, 'c1', answer('r1', { again: null }));
		expect(t.steps).toEqual(s.steps);
		expect(t.log[0].answer?.review.id).toBe('r1');
	});

	it('changes nothing for an unknown client id', () => {
		const s = grade(startSitting([item('a')]), 3, 'c1');
		expect(applyAnswer(s, 'nope', answer('r'))).toBe(s);
	});
});

describe('undoLast', () => {
	it('goes back one prompt and takes back the return it had queued', () => {
		const start = startSitting([item('a', { previews: reviewPreviews }), item('b'), item('c')]);
		const s = grade(grade(start, 1, 'c1'), 3, 'c2');
		expect(ids(s)).toEqual(['a:0/recall', 'b:0/recall', 'c:0/recall', 'a:1/recall']);
		const one = undoLast(s)!;
		expect(one.entry.clientId).toBe('c2');
		expect(currentStep(one.sitting)?.id).toBe('b:0');
		const two = undoLast(one.sitting)!;
		expect(two.entry).toMatchObject({ clientId: 'c1', grade: 1 });
		expect(two.sitting).toEqual(start);
	});

	it('takes back a lesson with the recall it had queued', () => {
		const start = startSitting([item('n', { isNew: true }), item('a')]);
		const undone = undoLast(finishTeaching(start, now.toISOString()))!;
		expect(undone.entry.kind).toBe('taught');
		expect(undone.sitting).toEqual(start);
	});

	it('has nothing to undo at the start', () => {
		expect(undoLast(startSitting([item('a')]))).toBeNull();
	});
});

describe('summarise', () => {
	it('counts reps, lessons, keys in order, minutes and tempo gains', () => {
		let s = startSitting([
			item('n', { isNew: true, key: 'Eb', tempo: 100 }),
			item('a', { key: 'F', tempo: 120 }),
			item('b', { key: 'Eb', tempo: 140 })
		]);
		s = finishTeaching(s, later(1));
		s = recordGrade(s, { grade: 4, clientId: 'c1', tempo: 128, at: new Date(later(3)) });
		s = recordGrade(s, { grade: 2, clientId: 'c2', tempo: 150, at: new Date(later(5)) });
		s = applyAnswer(s, 'c2', answer('r2', { tempo: 140 }));
		s = recordGrade(s, { grade: 3, clientId: 'c3', tempo: 100, at: new Date(later(12)) });
		expect(isFinished(s)).toBe(true);
		expect(summarise(s, now)).toEqual({
			reps: 3,
			taught: 1,
			minutes: 12,
			keys: ['F', 'Eb'],
			tempoGains: [{ lickId: 'lick-a', title: 'Lick a', from: 120, to: 128 }],
			byGrade: { 1: 0, 2: 1, 3: 1, 4: 1 }
		});
	});

	it('says zero minutes for a sitting where nothing was done', () => {
		expect(summarise(startSitting([item('a')]), now).minutes).toBe(0);
	});
});
