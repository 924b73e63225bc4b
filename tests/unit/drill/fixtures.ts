import type { DrillItem } from '../../../src/lib/drill/types';

/** A prompt as `GET /api/drill/today` sends it, with only what the sitting reads filled in. */
export function item(cardId: string, over: Partial<DrillItem> = {}): DrillItem {
	return {
		cardId,
		lickId: `lick-${cardId}`,
		title: `Lick ${cardId}`,
		key: 'C',
		writtenKey: 'C',
		quality: '7',
		instrument: 'concert',
		tempo: 120,
		targetTempo: 160,
		swingRatio: 2,
		abc: 'X:1\nK:C\nc',
		isNew: false,
		previews: {},
		variant: {
			abc: 'X:1\nK:C\nc',
			key: 'C',
			writtenKey: 'C',
			quality: '7',
			instrument: 'concert',
			warnings: [],
			notes: [],
			handWritten: false
		},
		...over
	};
}
