import { describe, expect, it } from 'vitest';
import { chordForDisplay, degreeForDisplay, noteForDisplay } from '../../../src/lib/ui/music-text';

describe('noteForDisplay', () => {
	it.each([
		['Bb4', 'B♭'],
		['F#5', 'F♯'],
		['C4', 'C'],
		['Ebb3', 'E♭♭'],
		['G##2', 'G♯♯'],
		['Db', 'D♭'],
		['', ''],
		['not a note', 'not a note']
	])('shows %j as %j', (pitch, shown) => {
		expect(noteForDisplay(pitch)).toBe(shown);
	});
});

describe('chordForDisplay', () => {
	it.each([
		['Bb7#11/Db', 'B♭7♯11/D♭'],
		['Ebm7b5', 'E♭m7♭5'],
		['F#m7', 'F♯m7'],
		['Db7b9#9', 'D♭7♭9♯9'],
		['C7alt', 'C7alt'],
		['Bbm6', 'B♭m6'],
		['Gb', 'G♭'],
		['', '']
	])('shows %j as %j', (symbol, shown) => {
		expect(chordForDisplay(symbol)).toBe(shown);
	});
});

describe('degreeForDisplay', () => {
	it.each([
		['b9', '♭9'],
		['#11', '♯11'],
		['bb7', '♭♭7'],
		['R', 'R'],
		['13', '13'],
		[null, '–']
	])('shows %j as %j', (label, shown) => {
		expect(degreeForDisplay(label)).toBe(shown);
	});
});
