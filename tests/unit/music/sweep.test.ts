/**
 * No valid input throws: every source key spelling (the 15 major and 15 minor signatures of the
 * circle of fifths, abc 2.1 §3.1.14, and modes) × every target name × every instrument × both
 * tritone settings, with lines that use every abc accidental (§4.2: ^^ ^ = _ __), ties across a
 * bar line (§4.11), grace notes and slash chords (§4.18). Each variant must also re-parse and
 * sound the pitches it claims.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { computeVariant, prepareLick, renderVariant } from '../../../src/lib/music/engine';
import { parseAbc } from '../../../src/lib/music/abc/parse';
import { INSTRUMENT_IDS } from '../../../src/lib/music/instruments';
import { QUALITY_IDS } from '../../../src/lib/music/types';

// abc 2.1 §3.1.14 key table: 7 sharps to 7 flats, major and minor (tonal 6.5.1 Key.majorKey /
// Key.minorKey agree on every signature: tests/unit/music/keys.test.ts).
const MAJOR = ['C', 'G', 'D', 'A', 'E', 'B', 'F#', 'C#', 'F', 'Bb', 'Eb', 'Ab', 'Db', 'Gb', 'Cb'];
const MINOR = ['Am', 'Em', 'Bm', 'F#m', 'C#m', 'G#m', 'D#m', 'A#m', 'Dm', 'Gm', 'Cm', 'Fm', 'Bbm'];
const MINOR_FLAT = ['Ebm', 'Abm'];
const MODES = ['Dmix', 'Ador', 'BbMix', 'F#Mix', 'C#Lyd', 'CbLoc', 'G#Phr', 'EbLoc', 'D Phr ^f'];
const SOURCE_KEYS = [...MAJOR, ...MINOR, ...MINOR_FLAT, ...MODES];
/** Every name a learner can ask for, enharmonic twins and odd spellings included. */
const TARGETS = [
	...['C', 'C#', 'Db', 'D', 'D#', 'Eb', 'E', 'F', 'F#', 'Gb', 'G', 'G#', 'Ab', 'A', 'A#', 'Bb'],
	...['B', 'Cb', 'E#', 'Fb', 'B#']
];
/** Lines using every accidental, ties across bars, graces and a slash chord. */
const LINES = [
	'"Gb7"G,B,D^E G4|]',
	'"C7"^C _D =E ^^F __G _A ^B c-|c {^d}e "E7/G#"^G2 z2|]',
	'"Am7"__c ^^d _e =f ^g ^a _b z|[K:Eb] "Bb7"B2 =e2 __a2 ^^f2|]'
];

const valid = (abc: string) => {
	const r = parseAbc(abc);
	if (!r.ok) throw new Error(`${r.error.message}\n${abc}`);
	return r.tune;
};

describe('the crash sweep', () => {
	it('renders every source key × target × instrument × tritone setting without throwing', () => {
		let count = 0;
		for (const key of SOURCE_KEYS) {
			for (const line of LINES) {
				const prepared = prepareLick(`X:1\nL:1/8\nK:${key}\n${line}\n`);
				if (!prepared.ok) throw new Error(prepared.error.message);
				for (const to of TARGETS)
					for (const instrument of INSTRUMENT_IDS)
						for (const tritone of ['Gb', 'F#'] as const) {
							const v = renderVariant(prepared.lick, { to, instrument, tritone });
							// The written text re-parses and sounds what the notes claim (an octave
							// transposing instrument aside, the written line is concert moved by a fixed
							// interval: the same for every note).
							const written = valid(v.abc).notes.map((n) => n.midi);
							const offsets = new Set(written.map((m, i) => m - v.notes[i].midi));
							expect(offsets.size).toBe(1);
							count++;
						}
			}
		}
		expect(count).toBe(
			SOURCE_KEYS.length * LINES.length * TARGETS.length * INSTRUMENT_IDS.length * 2
		);
	}, 180_000);

	it('re-maps over every quality in every key without throwing', () => {
		for (const key of SOURCE_KEYS) {
			const prepared = prepareLick(`X:1\nL:1/8\nK:${key}\n${LINES[1]}\n`);
			if (!prepared.ok) throw new Error(prepared.error.message);
			for (const to of TARGETS)
				for (const quality of QUALITY_IDS) {
					const v = renderVariant(prepared.lick, { to, quality, instrument: 'alto-sax' });
					expect(valid(v.abc).notes.length).toBe(v.notes.length);
				}
		}
	}, 180_000);

	it('never throws for random valid licks, keys, qualities and instruments (fast-check, fixed seed)', () => {
		const accidental = fc.constantFrom('', '', '', '^', '_', '=', '^^', '__');
		const note = fc
			.tuple(accidental, fc.constantFrom(...'CDEFGABcdefgab'), fc.constantFrom('', ',', "'"))
			.map(([a, l, o]) => a + l + (o === "'" && l === l.toUpperCase() ? '' : o));
		const line = fc.array(note, { minLength: 1, maxLength: 12 }).map((ns) => ns.join(' '));
		const chord = fc
			.tuple(
				fc.constantFrom(...'CDEFGAB'),
				fc.constantFrom('', '#', 'b'),
				fc.constantFrom(
					'7',
					'm7',
					'maj7',
					'm7b5',
					'7alt',
					'dim7',
					'6',
					'm6',
					'7sus4',
					'7#9',
					'mMaj7',
					'13',
					'xyz'
				),
				fc.constantFrom('', '/E', '/G#', '/Bb')
			)
			.map((parts) => parts.join(''));
		fc.assert(
			fc.property(
				fc.constantFrom(...SOURCE_KEYS),
				chord,
				line,
				fc.constantFrom(...TARGETS),
				fc.option(fc.constantFrom(...QUALITY_IDS), { nil: undefined }),
				fc.constantFrom(...INSTRUMENT_IDS),
				fc.constantFrom('Gb' as const, 'F#' as const),
				(key, symbol, notes, to, quality, instrument, tritone) => {
					const r = computeVariant({
						abc: `X:1\nL:1/8\nK:${key}\n"${symbol}"${notes}|]\n`,
						to,
						quality,
						instrument,
						tritone
					});
					// A quality asked of a lick whose chord names none is a request error, not a throw.
					if (r.ok) expect(valid(r.abc).notes.length).toBe(r.notes.length);
					else expect(r.error.message).toMatch(/quality|chord/);
				}
			),
			{ seed: 20261202, numRuns: 1500 }
		);
	}, 180_000);
});
