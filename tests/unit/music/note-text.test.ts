import { describe, expect, it } from 'vitest';
import { Interval, Note } from 'tonal';
import { respellNoteText } from '../../../src/lib/music/note-text';

/**
 * Names in a teaching note move with the key. The reference is tonal (a published library):
 * `Note.transpose(name, Interval.distance(from, to))` moves a pitch class by the interval between
 * two tonics, letter by letter, the way a name keeps its degree.
 */

const TONICS = ['C', 'Db', 'D', 'Eb', 'E', 'F', 'F#', 'Gb', 'G', 'Ab', 'A', 'Bb', 'B'];
const NAMES = ['Bb', 'F#', 'Eb', 'C', 'G', 'Db', 'B', 'E', 'Ab', 'A', 'Cb', 'E#'];

/** tonal's answer for one name between two tonics. */
const tonal = (name: string, from: string, to: string) =>
	Note.transpose(name, Interval.distance(from, to));

describe('respellNoteText', () => {
	it('moves every name as tonal transposes it, from and to every key (reference: tonal Interval.distance + Note.transpose)', () => {
		for (const from of TONICS) {
			for (const to of TONICS) {
				const text = NAMES.map((n) => `${n}7`).join(', ');
				const expected = NAMES.map((n) => `${tonal(n, from, to)}7`).join(', ');
				expect(respellNoteText(text, from, to).text, `${from} → ${to}`).toBe(expected);
			}
		}
	});

	it('keeps degrees: the ♭7 of C is the ♭7 of every key, and a name written with signs stays so', () => {
		const note = 'The B♭ is the ♭7 of C7; land on the E over Am7.';
		// tonal: Note.transpose('Bb', '4P') = 'Eb', Note.transpose('C', '4P') = 'F'.
		expect(respellNoteText(note, 'C', 'F')).toEqual({
			text: 'The E♭ is the ♭7 of F7; land on the E over Dm7.',
			moved: 3,
			bareLetters: 1
		});
		// tonal: Note.transpose('Bb', '5d') = 'Fb' (the ♭7 of G♭), not E.
		expect(respellNoteText('the B♭', 'C', 'Gb').text).toBe('the F♭');
		expect(tonal('Bb', 'C', 'Gb')).toBe('Fb');
		expect(respellNoteText('aim for Bb then F#', 'C', 'D').text).toBe('aim for C then G#');
	});

	it('moves chord names by their roots and keeps their suffixes', () => {
		const text = 'Cmaj7 to Dm7b5 to G7#9 to Ebdim7, then F6 and Bbsus4';
		expect(respellNoteText(text, 'C', 'Eb').text).toBe(
			'Ebmaj7 to Fm7b5 to Bb7#9 to Gbdim7, then Ab6 and Dbsus4'
		);
	});

	it('leaves words alone and counts the bare letters it could not tell from words', () => {
		const text = 'A chromatic approach, e.g. Ebony or Dorian; ABC; play the C softly.';
		const result = respellNoteText(text, 'C', 'D');
		expect(result.text).toBe(text);
		expect(result.moved).toBe(0);
		// "A chromatic" is the article; "the C" is a bare letter left as written.
		expect(result.bareLetters).toBe(1);
	});

	it('changes nothing for the home key itself or for a tonic it cannot read', () => {
		const note = 'The B♭ over C7.';
		expect(respellNoteText(note, 'C', 'C')).toEqual({ text: note, moved: 2, bareLetters: 0 });
		expect(respellNoteText(note, 'C', 'H')).toEqual({ text: note, moved: 0, bareLetters: 0 });
	});
});
