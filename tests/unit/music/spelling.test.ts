import { describe, expect, it } from 'vitest';
import { Key, Note } from 'tonal';
import { keyOf, parseKeyField } from '../../../src/lib/music/keys';
import { formatNoteName, formatPitch, parsePitchName } from '../../../src/lib/music/pitch';
import { respellKey, simplifySpelling } from '../../../src/lib/music/spelling';

describe('spelling', () => {
	it.each([
		// [pitch, key, expected]: double accidentals and out-of-key E#/B#/Cb/Fb give way (common practice)
		['F##4', 'B', 'G4'],
		['Bbb3', 'F', 'A3'],
		['E#4', 'C', 'F4'],
		['B#4', 'C', 'C5'],
		['Cb5', 'C', 'B4'],
		['Fb4', 'C', 'E4'],
		['Cb5', 'Gb', 'Cb5'],
		['E#4', 'F#', 'E#4'],
		['C#4', 'C', 'C#4'],
		['Db4', 'C', 'Db4'],
		['B4', 'Gb', 'Cb5'],
		['Db4', 'E', 'C#4'],
		['Gb4', 'D', 'F#4'],
		['A#4', 'F', 'Bb4']
	])('writes %s in %s major as %s', (pitch, key, expected) => {
		const p = simplifySpelling(parsePitchName(pitch)!, keyOf(key).accidentals);
		expect(formatPitch(p)).toBe(expected);
		// the sound never changes (tonal 6.5.1 Note.midi)
		expect(Note.midi(formatPitch(p))).toBe(Note.midi(pitch));
	});

	it('respells a key with more accidentals than its enharmonic twin and says so', () => {
		const gs = respellKey(keyOf('G#'));
		expect(formatNoteName(gs.key.tonic)).toBe('Ab');
		expect(gs.warning?.code).toBe('key-respelled');
		expect(gs.warning?.message).toMatch(/G# .*8 sharps.*Ab/);
		// tonal 6.5.1 Key.majorKey: G# would have 8 sharps, Ab has 4 flats
		expect(Key.majorKey('G#').alteration).toBe(8);
		expect(Key.majorKey('Ab').alteration).toBe(-4);
		expect(formatNoteName(respellKey(keyOf('D#', 'minor')).key.tonic)).toBe('D#');
		expect(formatNoteName(respellKey(keyOf('A#', 'minor')).key.tonic)).toBe('Bb');
		expect(formatNoteName(respellKey(keyOf('Gb', 'minor')).key.tonic)).toBe('F#');
	});

	it('keeps keys that are already the shortest, ties included', () => {
		for (const k of ['C', 'F#', 'Gb', 'Db', 'B']) {
			const r = respellKey(keyOf(k));
			expect(formatNoteName(r.key.tonic), k).toBe(k);
			expect(r.warning).toBeNull();
		}
		const none = parseKeyField('none');
		expect(none.ok && respellKey(none.key).warning).toBeNull();
	});

	it('respells C# major to Db and Cb major to B', () => {
		expect(formatNoteName(respellKey(keyOf('C#')).key.tonic)).toBe('Db');
		expect(formatNoteName(respellKey(keyOf('Cb')).key.tonic)).toBe('B');
	});
});
