import { describe, expect, it } from 'vitest';
import {
	chordForDisplay,
	countInBeats,
	degreeForDisplay,
	noteForDisplay,
	tempoFromAbc
} from '../../../src/lib/ui/music-text';

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

describe('tempoFromAbc', () => {
	// abc standard 2.1 §3.1.8 for the Q: forms.
	it.each([
		['X:1\nQ:1/4=132\nK:C', 132],
		['Q:1/2=60\nK:C', 120],
		['Q:3/8=40\nK:C', 60],
		['Q:100\nK:C', 100],
		['X:1\nK:C', 120],
		['Q:fast\nK:C', 120],
		['Q:1/4=0\nK:C', 120]
	])('reads the tempo of %j as %d quarters a minute', (abc, bpm) => {
		expect(tempoFromAbc(abc)).toBe(bpm);
	});
});

describe('countInBeats', () => {
	// abc standard 2.1 §3.1.6 for the M: forms; the pulse per meter is common practice.
	it.each([
		['M:4/4', 4],
		['M:3/4', 3],
		['M:6/8', 2],
		['M:12/8', 4],
		['M:5/8', 5],
		['M:2/2', 4],
		['M:C', 4],
		['M:C|', 4],
		['M:none', 4],
		['K:C', 4],
		['M:0/4', 4]
	])('counts in %j with %d beats', (abc, beats) => {
		expect(countInBeats(abc)).toBe(beats);
	});
});
