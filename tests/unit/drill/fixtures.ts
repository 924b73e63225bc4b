import type { ReviewAnswer, TodayItem } from '../../../src/lib/drill/types';

/** A prompt as `GET /api/drill/today` sends it, with only what the sitting reads set apart. */
export function item(cardId: string, over: Partial<TodayItem> = {}): TodayItem {
	return {
		cardId,
		lickId: `lick-${cardId}`,
		title: `Lick ${cardId}`,
		key: 'C',
		writtenKey: 'C',
		quality: '7',
		homeQuality: '7',
		instrument: 'concert',
		tempo: 120,
		targetTempo: 160,
		swingRatio: 2,
		abc: 'X:1\nK:C\nc',
		note: '',
		noteNames: 'none',
		isNew: false,
		state: 'review',
		due: '2026-03-01T10:00:00.000Z',
		retrievability: 0.8,
		previews: {} as TodayItem['previews'],
		variant: {
			abc: 'X:1\nK:C\nc',
			key: 'C',
			writtenKey: 'C',
			concertKey: 'C',
			writtenTonic: 'C',
			mode: 'major',
			meter: '4/4',
			beatsPerBar: 4,
			tempo: 120,
			quality: '7',
			instrument: 'concert',
			warnings: [],
			notes: [],
			handWritten: false
		},
		comments: [],
		version: 1,
		...over
	};
}

/** The server's answer to a review, with the card's tempo rung and its `again` prompt. */
export function answer(
	reviewId: string,
	over: { tempo?: number | null; again?: TodayItem | null; due?: string; state?: number } = {}
): ReviewAnswer {
	return {
		review: {
			id: reviewId,
			cardId: 'card',
			clientId: `client-${reviewId}`,
			sittingId: null,
			reviewedAt: '2026-03-01T19:00:00.000Z',
			day: '2026-03-01',
			grade: 3,
			key: 'C',
			quality: '7',
			tempo: 120,
			revealMs: null,
			gradeMs: null,
			undoneAt: null
		},
		card: {
			id: 'card',
			version: 2,
			stateName: over.state === 1 ? 'learning' : over.state === 3 ? 'relearning' : 'review',
			due: over.due ?? '2026-03-05T19:00:00.000Z',
			stability: 5,
			difficulty: 5,
			scheduledDays: 4,
			learningSteps: 0,
			reps: 3,
			lapses: 0,
			state: over.state ?? 2,
			lastReview: '2026-03-01T19:00:00.000Z',
			tempo: over.tempo === undefined ? 120 : over.tempo,
			introducedDay: '2026-02-20'
		},
		duplicate: false,
		again: over.again ?? null
	};
}
