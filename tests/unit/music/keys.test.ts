import { describe, expect, it } from 'vitest';
import { Key } from 'tonal';
import {
	formatKeyField,
	jazzTonic,
	keyOf,
	parseKeyField,
	signatureAccidentals,
	twelveKeys,
	type KeySignature
} from '../../../src/lib/music/keys';
import {
	CYCLE_OF_FOURTHS,
	MAJOR_KEY_SPELLINGS,
	MINOR_KEY_SPELLINGS
} from '../../../src/lib/music/key-data';
import { formatNoteName } from '../../../src/lib/music/pitch';

const ok = (value: string): KeySignature => {
	const r = parseKeyField(value);
	if (!r.ok) throw new Error(r.message);
	return r.key;
};
/** Letters carrying a sharp or flat, as text: "F# C#", "Bb Eb". */
const named = (alts: number[]): string =>
	alts
		.map((a, l) => (a === 0 ? '' : formatNoteName({ letter: l, alt: a })))
		.filter(Boolean)
		.sort()
		.join(' ');

describe('key signatures', () => {
	it('match the circle of fifths for every major and minor key (tonal 6.5.1 Key.majorKey/minorKey .alteration)', () => {
		const majors = [
			'C',
			'G',
			'D',
			'A',
			'E',
			'B',
			'F#',
			'C#',
			'F',
			'Bb',
			'Eb',
			'Ab',
			'Db',
			'Gb',
			'Cb'
		];
		for (const k of majors) {
			// reference: tonal 6.5.1 Key.majorKey(k).alteration
			expect(keyOf(k, 'major').fifths, k).toBe(Key.majorKey(k).alteration);
			// reference: tonal 6.5.1 Key.majorKey(k).keySignature lists the same accidentals
			const sig = Key.majorKey(k).keySignature;
			const count = sig.length;
			expect(
				keyOf(k).accidentals.reduce((a, b) => a + Math.abs(b), 0),
				k
			).toBe(count);
		}
		const minors = ['A', 'E', 'B', 'F#', 'C#', 'G#', 'D#', 'Eb', 'Bb', 'F', 'C', 'G', 'D'];
		for (const k of minors) {
			// reference: tonal 6.5.1 Key.minorKey(k).alteration
			expect(keyOf(k, 'minor').fifths, k).toBe(Key.minorKey(k).alteration);
		}
	});

	it('adds sharps in the order F C G D A E B and flats in the order B E A D G C F', () => {
		// reference: any harmony text (Kostka & Payne, Tonal Harmony, from memory)
		expect(named(signatureAccidentals(1))).toBe('F#');
		expect(named(signatureAccidentals(3))).toBe('C# F# G#');
		expect(named(signatureAccidentals(-2))).toBe('Bb Eb');
		expect(named(signatureAccidentals(-4))).toBe('Ab Bb Db Eb');
		expect(named(signatureAccidentals(7))).toBe('A# B# C# D# E# F# G#');
		expect(named(signatureAccidentals(8))).toBe('A# B# C# D# E# F## G#');
	});

	it.each([
		// abc 2.1 §3.1.14: modes, case-insensitive, only three letters count, m is minor
		['G', 1],
		['Dm', -1],
		['Dmix', 1],
		['Ador', 1],
		['ADOR', 1],
		['A Dorian', 1],
		['BbMix', -3],
		['F#Mix', 5],
		['Abm', -7],
		['E phr', 0],
		['F lyd', 0],
		['B loc', 0],
		['C ionian', 0],
		['A aeolian', 0],
		['Gb', -6],
		['C#m', 4],
		['', 0]
	])('K:%s has %i sharps (+) or flats (−)', (value, fifths) => {
		expect(ok(value).fifths).toBe(fifths);
	});

	it('applies explicit accidentals after the mode (abc 2.1 §3.1.14)', () => {
		expect(named(ok('D Phr ^f').accidentals)).toBe('Bb Eb F#');
		expect(named(ok('D =c').accidentals)).toBe('F#');
		expect(ok('D =c').explicit).toEqual([{ letter: 0, alt: 0 }]);
		expect(named(ok('C exp _b _e').accidentals)).toBe('Bb Eb');
	});

	it('reads K:none as no signature and keeps clef settings as text', () => {
		expect(ok('none').none).toBe(true);
		expect(ok('none').accidentals).toEqual([0, 0, 0, 0, 0, 0, 0]);
		expect(ok('Bb clef=bass').rest).toBe('clef=bass');
		expect(ok('G treble-8').rest).toBe('treble-8');
		expect(formatKeyField(ok('D Phr ^f clef=bass middle=d'))).toBe('Dphr ^f clef=bass middle=d');
	});

	it.each([['H'], ['Dmixer'], ['C foo'], ['Bx'], ['^'], ['7'], ['C ^z']])(
		'refuses the unknown key K:%s with a message',
		(value) => {
			const r = parseKeyField(value);
			expect(r.ok).toBe(false);
			if (!r.ok) expect(r.message).toMatch(/key|mode|accidental/);
		}
	);

	it('spells the twelve major keys the jazz way, with the tritone key by setting (common practice)', () => {
		const gb = Array.from({ length: 12 }, (_, pc) => formatNoteName(jazzTonic(pc, 'major', 'Gb')));
		expect(gb).toEqual(['C', 'Db', 'D', 'Eb', 'E', 'F', 'Gb', 'G', 'Ab', 'A', 'Bb', 'B']);
		expect(formatNoteName(jazzTonic(6, 'major', 'F#'))).toBe('F#');
		expect(MAJOR_KEY_SPELLINGS).toEqual(gb);
		// every jazz major key has at most six accidentals (tonal 6.5.1 Key.majorKey)
		for (const k of gb) expect(Math.abs(Key.majorKey(k).alteration), k).toBeLessThanOrEqual(6);
	});

	it('spells the twelve minor keys C C# D Eb E F F# G G# A Bb B (common practice)', () => {
		const minor = Array.from({ length: 12 }, (_, pc) => formatNoteName(jazzTonic(pc, 'minor')));
		expect(minor).toEqual(['C', 'C#', 'D', 'Eb', 'E', 'F', 'F#', 'G', 'G#', 'A', 'Bb', 'B']);
		expect(MINOR_KEY_SPELLINGS).toEqual(minor);
		for (const k of minor) expect(Math.abs(Key.minorKey(k).alteration), k).toBeLessThanOrEqual(6);
	});

	it('spells other modes with the fewest accidentals', () => {
		for (const mode of ['dorian', 'mixolydian', 'lydian', 'phrygian', 'locrian'] as const) {
			for (let pc = 0; pc < 12; pc++) {
				expect(
					Math.abs(keyOf(jazzTonic(pc, mode), mode).fifths),
					`${mode} ${pc}`
				).toBeLessThanOrEqual(6);
			}
		}
	});

	it('lists twelve drill keys per mode and tritone setting', () => {
		expect(twelveKeys('major', 'F#')).toEqual([
			'C',
			'Db',
			'D',
			'Eb',
			'E',
			'F',
			'F#',
			'G',
			'Ab',
			'A',
			'Bb',
			'B'
		]);
		expect(twelveKeys('minor')).toEqual([...MINOR_KEY_SPELLINGS]);
	});

	it('lists the cycle of fourths as C F Bb Eb Ab Db Gb B E A D G (common practice)', () => {
		expect(CYCLE_OF_FOURTHS.join(' ')).toBe('C F Bb Eb Ab Db Gb B E A D G');
	});
});
