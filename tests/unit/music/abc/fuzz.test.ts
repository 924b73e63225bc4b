import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { computeVariant } from '../../../../src/lib/music/engine';
import { INSTRUMENT_IDS } from '../../../../src/lib/music/instruments';
import { QUALITY_IDS } from '../../../../src/lib/music/types';

/** Valid licks of our own to break. */
const SEEDS = [
	'X:1\nT:One\nM:4/4\nL:1/8\nK:Bb\n"Bb7"B,DFA _A=GFD | "Eb7"E2 (3GB_d c>B G2 |]\n',
	'X:1\nT:Two\nM:6/8\nK:Dm\n"Dm7"!trill!d2f {g}a3 | [DFA]3 z3 :|\\\n|: "A7alt"^c2 e- e3 |]\n',
	'X:1\nM:C\nL:1/16\nK:F#mix clef=bass\n"F#7"F,2A,2 C4 | (3:2:2EF "^solo"G8 |]\n'
];
/** Characters that mean something in abc, and a few that do not. */
const ALPHABET = [
	...'ABCDEFGabcdefgzxZ^_=,\'/23456789|:[]{}()"!+-<>.~%\\ \n\tKLMQXT&#*;?@$`y€é\u0000'
];

const mutated = fc
	.record({
		seed: fc.constantFrom(...SEEDS),
		edits: fc.array(
			fc.record({
				at: fc.nat(),
				remove: fc.nat({ max: 3 }),
				insert: fc.array(fc.constantFrom(...ALPHABET), { maxLength: 4 }).map((a) => a.join(''))
			}),
			{ minLength: 1, maxLength: 6 }
		)
	})
	.map(({ seed, edits }) =>
		edits.reduce((text, e) => {
			const at = e.at % (text.length + 1);
			return text.slice(0, at) + e.insert + text.slice(at + e.remove);
		}, seed)
	);
const noise = fc.array(fc.constantFrom(...ALPHABET), { maxLength: 120 }).map((a) => a.join(''));
const headed = noise.map((n) => 'X:1\nK:C\n' + n);

describe('fuzzing the abc reader', () => {
	it('ends every malformed input in an error result or a valid result, never an exception', () => {
		let errors = 0;
		fc.assert(
			fc.property(
				fc.oneof(
					{ weight: 3, arbitrary: mutated },
					{ weight: 1, arbitrary: noise },
					{ weight: 2, arbitrary: headed }
				),
				fc.option(fc.constantFrom('C', 'Eb', 'F#', 'Gb', 'B', 'A#', 'H', '')),
				fc.option(fc.constantFrom(...QUALITY_IDS)),
				fc.option(fc.constantFrom(...INSTRUMENT_IDS)),
				(abc, to, quality, instrument) => {
					const r = computeVariant({
						abc,
						to: to ?? undefined,
						quality: quality ?? undefined,
						instrument: instrument ?? undefined
					});
					if (r.ok) {
						expect(typeof r.abc).toBe('string');
						expect(r.notes.length).toBeGreaterThan(0);
					} else {
						errors++;
						expect(r.error.message.length).toBeGreaterThan(10);
						if (r.error.line !== undefined) {
							expect(r.error.line).toBeGreaterThanOrEqual(1);
							expect(r.error.column).toBeGreaterThanOrEqual(1);
						}
					}
				}
			),
			{ numRuns: 3000, seed: 424242 }
		);
		// Both outcomes occur. How long the reader takes is measured by `npm run bench`, never here.
		expect(errors).toBeGreaterThan(100);
		expect(errors).toBeLessThan(3000);
	});
});
