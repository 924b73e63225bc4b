/**
 * The demo licks: short lines written by the Twelvefold team for the invented Lantern Street
 * Jazz Workshop, in two decks. None comes from a recording, a solo or a book. Each is abc 2.1 at
 * concert pitch, in its home key, with the device it teaches named in `devices` (the analysis
 * must find it: tests/unit/demo/licks.test.ts checks) and a teaching note.
 */
export interface DemoLick {
	/** Stable slug, also the abc title's source. */
	slug: string;
	title: string;
	deck: DemoDeckSlug;
	/** Device kinds the line is written to show (`arpeggio`, `chromatic-fill`, `enclosure`, `leap`). */
	devices: string[];
	note: string;
	abc: string;
}

export const DEMO_DECKS = [
	{ slug: 'first-steps', title: 'First steps over the dominant' },
	{ slug: 'colours', title: 'Colours and leaps' }
] as const;
export type DemoDeckSlug = (typeof DEMO_DECKS)[number]['slug'];

const lick = (title: string, tempo: number, key: string, body: string) =>
	['X:1', `T:${title}`, 'M:4/4', 'L:1/8', `Q:1/4=${tempo}`, `K:${key}`, body].join('\n');

export const DEMO_LICKS: readonly DemoLick[] = [
	{
		slug: 'blue-turn',
		title: 'Blue turn',
		deck: 'first-steps',
		devices: ['arpeggio'],
		note: 'Up from the root to the 3 5 b7 of C7 (an Edim triad), then the #9 (Eb) bends into the 3 (E).',
		abc: lick('Blue turn', 132, 'C', '"C7" c d e g _b a g e | _e =e g _b- _b2 z2 |]')
	},
	{
		slug: 'porch-light',
		title: 'Porch light',
		deck: 'first-steps',
		devices: ['enclosure'],
		note: 'The 3 of C7 (E) is approached from a half step above and below (F, D#) before it lands.',
		abc: lick('Porch light', 120, 'C', '"C7" f ^d e g _b a g e | d c B c z4 |]')
	},
	{
		slug: 'slow-slide',
		title: 'Slow slide',
		deck: 'first-steps',
		devices: ['chromatic-fill'],
		note: 'From the 3 down to the root of D7 in half steps: F# F E Eb D, chord tones on beats 1 and 3.',
		abc: lick('Slow slide', 116, 'D', '"D7" f =f e _e d A ^F A | d4 z4 |]')
	},
	{
		slug: 'upstairs',
		title: 'Upstairs',
		deck: 'first-steps',
		devices: ['arpeggio'],
		note: 'A Dm7 arpeggio from the root, then the 9 and 11 above it: Dorian colour over the ii chord.',
		abc: lick('Upstairs', 126, 'C', "\"Dm7\" d f a c' e' d' c' a | f2 e2 d4 |]")
	},
	{
		slug: 'tin-roof',
		title: 'Tin roof',
		deck: 'colours',
		devices: ['arpeggio'],
		note: 'An Fmaj7 arpeggio built on the b7 of G7 gives b7 9 11 13: the suspended upper structure.',
		abc: lick('Tin roof', 112, 'C', "\"G7\" f a c' e' d' b g f | e4 z4 |]")
	},
	{
		slug: 'side-step',
		title: 'Side step',
		deck: 'colours',
		devices: ['enclosure'],
		note: 'The 5 of F7 (C) enclosed by D above and B below, then down with a b9 (Gb) on the way home.',
		abc: lick('Side step', 138, 'F', '"F7" d =B c A _G F _E C | F4 z4 |]')
	},
	{
		slug: 'long-jump',
		title: 'Long jump',
		deck: 'colours',
		devices: ['leap'],
		note: 'A sixth up from the 5 of Bb7 keeps the eighth notes moving without running up the scale.',
		abc: lick('Long jump', 120, 'Bb', '"Bb7" F d c A G e d B | c4 z4 |]')
	},
	{
		slug: 'night-bus',
		title: 'Night bus',
		deck: 'colours',
		devices: [],
		note: 'Down the altered scale of G7alt from the b13: b13 #9 R b7 b13 #11 3 b9, then the 5 of C.',
		abc: lick('Night bus', 108, 'C', '"G7alt" _e _B G F _E _D =B, _A, | "Cmaj7" G,4 z4 |]')
	}
];
