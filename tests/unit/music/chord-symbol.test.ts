import { describe, expect, it } from 'vitest';
import { Chord, Note } from 'tonal';
import {
	formatChordSymbol,
	parseChordSymbol,
	reduceQuality
} from '../../../src/lib/music/chord-symbol';
import { chordTones } from '../../../src/lib/music/qualities';

const chroma = (n: string) => Note.chroma(n);

describe('parseChordSymbol', () => {
	// Symbols from the lead-sheet vocabulary (abc 2.1 §4.18: <note><accidental><type></bass>).
	it.each([
		['C7', 'C', '7', '7', null],
		['Cm7', 'C', 'm7', 'm7', null],
		['C-7', 'C', '-7', 'm7', null],
		['Cmi7', 'C', 'mi7', 'm7', null],
		['Cmaj7', 'C', 'maj7', 'maj7', null],
		['CΔ7', 'C', 'Δ7', 'maj7', null],
		['CΔ', 'C', 'Δ', 'maj7', null],
		['CM7', 'C', 'M7', 'maj7', null],
		['C^7', 'C', '^7', 'maj7', null],
		['Cmaj9', 'C', 'maj9', 'maj7', null],
		['C', 'C', '', 'maj7', null],
		['Cm7b5', 'C', 'm7b5', 'm7b5', null],
		['Cm7(b5)', 'C', 'm7(b5)', 'm7b5', null],
		['F#m7-5', 'F#', 'm7-5', 'm7b5', null],
		['Cø', 'C', 'ø', 'm7b5', null],
		['Cø7', 'C', 'ø7', 'm7b5', null],
		['C7alt', 'C', '7alt', '7alt', null],
		['Calt', 'C', 'alt', '7alt', null],
		['C7#9', 'C', '7#9', '7alt', null],
		['C7#5', 'C', '7#5', '7alt', null],
		['C7b9b13', 'C', '7b9b13', '7alt', null],
		['Co7', 'C', 'o7', 'dim7', null],
		['C°7', 'C', '°7', 'dim7', null],
		['Cdim7', 'C', 'dim7', 'dim7', null],
		['Cdim', 'C', 'dim', 'dim7', null],
		['C6', 'C', '6', '6', null],
		['C6/9', 'C', '6/9', '6', null],
		['C69', 'C', '69', '6', null],
		['Cm6', 'C', 'm6', 'm6', null],
		['C-6', 'C', '-6', 'm6', null],
		['C7sus4', 'C', '7sus4', '7sus4', null],
		['C9sus', 'C', '9sus', '7sus4', null],
		['C11', 'C', '11', '7sus4', null],
		['C7b9', 'C', '7b9', '7', null],
		['C7(b9)', 'C', '7(b9)', '7', null],
		['C7#11', 'C', '7#11', '7', null],
		['C13', 'C', '13', '7', null],
		['C9', 'C', '9', '7', null],
		['E♭7', 'Eb', '7', '7', null],
		['Bb7#11/D', 'Bb', '7#11', '7', 'D'],
		['Am7/G', 'A', 'm7', 'm7', 'G'],
		['F/Eb', 'F', '', 'maj7', 'Eb'],
		['C6/9/E', 'C', '6/9', '6', 'E'],
		['(G7)', 'G', '7', '7', null],
		['C–7', 'C', '–7', 'm7', null],
		['C♯m7', 'C#', 'm7', 'm7', null],
		['CMaj7', 'C', 'Maj7', 'maj7', null]
	])('reads %s as root %s, type %j, quality %s, bass %s', (text, root, suffix, quality, bass) => {
		expect(parseChordSymbol(text)).toEqual({ symbol: text, root, suffix, quality, bass });
	});

	it.each([['CmM7'], ['Cm(maj7)'], ['C+'], ['Caug'], ['Csus2'], ['C5'], ['Cmaj7#5']])(
		'reads %s but reduces it to no quality the engine re-maps over',
		(text) => {
			const parsed = parseChordSymbol(text);
			expect(parsed).not.toBeNull();
			expect(parsed!.quality).toBeNull();
		}
	);

	it.each([[''], ['N.C.'], ['Coda'], ['Fine'], ['H7'], ['c7'], ['^solo'], ['7'], ['Gx7'], ['C7!']])(
		'refuses %j, which is not a chord symbol',
		(text) => {
			expect(parseChordSymbol(text)).toBeNull();
		}
	);

	it('reduces to qualities whose chord tones tonal 6.5.1 Chord.get also finds in the symbol', () => {
		// reference: tonal 6.5.1 Chord.get; symbols tonal reads (REFERENCES.md §3 caveats: not CΔ7, Cø7)
		const symbols = [
			'C7',
			'Cm7',
			'C-7',
			'Cmaj7',
			'CΔ',
			'CM7',
			'C^7',
			'Cm7b5',
			'Cø',
			'C7alt',
			'Co7',
			'Cdim7',
			'C6',
			'C6/9',
			'Cm6',
			'C7sus4',
			'C7b9',
			'C7#9',
			'C7#11',
			'C13',
			'C9',
			'Ebm9',
			'F#7b13',
			'Bb7#11/D',
			'Am7/G',
			'Dbmaj9',
			'G9sus4'
		];
		for (const symbol of symbols) {
			const ours = parseChordSymbol(symbol)!;
			const theirs = Chord.get(symbol);
			expect(theirs.empty, symbol).toBe(false);
			expect(ours.root, symbol).toBe(theirs.tonic);
			const tonal = new Set(theirs.notes.map(chroma));
			for (const tone of chordTones(ours.quality!, ours.root))
				expect(tonal.has(chroma(tone)), `${symbol} ${tone}`).toBe(true);
		}
	});

	it('is total over garbage: every string gives a symbol or null, never an exception', () => {
		const junk = [
			'((',
			')',
			'/',
			'C/',
			'C//D',
			'Bb/H',
			'A#b',
			'C\u0000',
			'D'.repeat(200),
			'  Dm7  ',
			'G7/',
			'Bbb7'
		];
		for (const text of junk) expect(() => parseChordSymbol(text), text).not.toThrow();
		expect(parseChordSymbol('  Dm7  ')!.symbol).toBe('Dm7');
		expect(parseChordSymbol('G7/')!.bass).toBeNull();
	});
});

describe('reduceQuality', () => {
	it.each([
		['-7', 'm7'],
		['min7', 'm7'],
		['m11', 'm7'],
		['ma7', 'maj7'],
		['Maj7#11', 'maj7'],
		['13b9', '7'],
		['+7', '7alt'],
		['7b5', '7alt'],
		['sus', '7sus4'],
		['mmaj7', null],
		['xyz', null]
	])('reduces the type %j to %s', (suffix, quality) => {
		expect(reduceQuality(suffix)).toBe(quality);
	});
});

describe('formatChordSymbol', () => {
	it.each([
		[{ root: 'Bb', suffix: '7#11', bass: 'D' }, 'Bb7#11/D'],
		[{ root: 'F#', suffix: 'm7b5' }, 'F#m7b5'],
		[{ root: 'C', suffix: '6/9', bass: null }, 'C6/9']
	])('writes %j as %s', (parts, text) => {
		expect(formatChordSymbol(parts)).toBe(text);
	});

	it('round-trips what parseChordSymbol read', () => {
		for (const text of ['Bb7#11/D', 'Am7/G', 'Ebmaj7', 'C6/9', 'F#ø7']) {
			const parsed = parseChordSymbol(text)!;
			expect(formatChordSymbol(parsed)).toBe(text);
		}
	});
});
