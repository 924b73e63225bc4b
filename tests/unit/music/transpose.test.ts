import { describe, expect, it } from 'vitest';
import { Interval, Note } from 'tonal';
import { formatKeyField, keyOf, parseKeyField } from '../../../src/lib/music/keys';
import {
	formatNoteName,
	formatPitch,
	intervalName,
	parseNoteName,
	parsePitchName
} from '../../../src/lib/music/pitch';
import {
	intervalToKey,
	jazzKey,
	planKeys,
	shiftPlan,
	transposeInKey,
	transposeKey
} from '../../../src/lib/music/transpose';

const n = (name: string) => parseNoteName(name)!;

describe('transposition', () => {
	it.each([
		['C', 'D', '2M'],
		['C', 'Bb', '-2M'],
		['Bb', 'C', '2M'],
		['C', 'F#', '4A'],
		['C', 'Gb', '-4A'],
		['C', 'G', '-4P'],
		['C', 'F', '4P'],
		['Eb', 'A', '4A'],
		['A', 'Eb', '-4A'],
		['D', 'Db', '-1A']
	])('goes from %s to %s by the shorter way, %s', (from, to, name) => {
		const iv = intervalToKey(n(from), n(to));
		expect(intervalName(iv)).toBe(name);
		// reference: tonal 6.5.1 Note.transpose lands on the target pitch class
		expect(Note.pitchClass(Note.transpose(from + '4', name))).toBe(to);
		expect(Math.abs(iv.semitones)).toBeLessThanOrEqual(6);
	});

	it('moves every pitch by the interval like tonal Note.transpose, then spells it for the key', () => {
		const iv = intervalToKey(n('Bb'), n('E'));
		const key = keyOf('E');
		for (const p of ['Bb3', 'D4', 'F4', 'Ab4', 'Cb5', 'E4', 'G#4']) {
			const ours = formatPitch(transposeInKey(parsePitchName(p)!, iv, key));
			// reference: tonal 6.5.1 Note.transpose with Interval.distance's interval, then Note.midi
			const ref = Note.transpose(p, Interval.distance('Bb', 'E'));
			expect(Note.midi(ours), p).toBe(Note.midi(ref));
		}
		expect(formatPitch(transposeInKey(parsePitchName('Ab4')!, iv, key))).toBe('D5');
		expect(formatPitch(transposeInKey(parsePitchName('Cb5')!, iv, key))).toBe('F5');
	});

	it('moves keys with their explicit accidentals and clef text', () => {
		const parsed = parseKeyField('D Phr ^f clef=bass');
		if (!parsed.ok) throw new Error(parsed.message);
		const moved = transposeKey(parsed.key, { steps: 1, semitones: 2 });
		expect(formatKeyField(moved.key)).toBe('Ephr ^g clef=bass');
	});

	it('respells a transposed key with too many accidentals, moving explicit accidentals along', () => {
		const parsed = parseKeyField('E =d');
		if (!parsed.ok) throw new Error(parsed.message);
		// E up a major sixth is C# (7 sharps) → Db; the lowered seventh (D natural in E) becomes Cb
		const moved = transposeKey(parsed.key, { steps: 5, semitones: 9 });
		expect(formatNoteName(moved.key.tonic)).toBe('Db');
		expect(moved.warning?.code).toBe('key-respelled');
		expect(formatKeyField(moved.key)).toBe('Db _c');
	});

	it('plans one interval for the whole tune and follows later key changes', () => {
		const plan = planKeys([keyOf('Bb'), keyOf('G'), keyOf('D', 'minor')], n('C'));
		expect(intervalName(plan.interval)).toBe('2M');
		expect(plan.keys.map(formatKeyField)).toEqual(['C', 'A', 'Em']);
		const octave = planKeys([keyOf('C')], n('C'), { octaves: -1 });
		expect(octave.interval).toEqual({ steps: -7, semitones: -12 });
	});

	it('asks for G# and writes Ab with a warning', () => {
		const plan = planKeys([keyOf('C')], n('G#'));
		expect(plan.keys.map(formatKeyField)).toEqual(['Ab']);
		expect(plan.warnings[0].code).toBe('key-respelled');
	});

	it('adds an instrument offset on top of a concert plan (concert B for alto sax is written G# → Ab)', () => {
		const keys = [keyOf('C')];
		const concert = planKeys(keys, n('B'));
		// REFERENCES.md §4: E-flat alto sounds a major sixth below written, so it reads a major sixth up
		const alto = shiftPlan(keys, concert, { steps: 5, semitones: 9 });
		expect(formatKeyField(alto.keys[0])).toBe('Ab');
		expect(alto.warnings.map((w) => w.code)).toEqual(['key-respelled']);
	});

	it('builds twelve-key targets by pitch class', () => {
		expect(formatKeyField(jazzKey(6, 'major', 'F#'))).toBe('F#');
		expect(formatKeyField(jazzKey(6, 'major', 'Gb'))).toBe('Gb');
		expect(formatKeyField(jazzKey(3, 'minor'))).toBe('Ebm');
	});
});
