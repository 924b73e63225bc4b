import { describe, expect, it } from 'vitest';
import { Chord, Interval, Note, Scale } from 'tonal';
import {
	chordScale,
	chordTones,
	isQualityId,
	parseInterval,
	qualityTable
} from '../../../src/lib/music/qualities';
import { QUALITY_IDS, type QualityId } from '../../../src/lib/music/types';

const ROOTS = ['C', 'Db', 'D', 'Eb', 'E', 'F', 'F#', 'Gb', 'G', 'Ab', 'A', 'Bb', 'B'];
const chromas = (notes: string[]) =>
	[...new Set(notes.map((n) => Note.chroma(n)))].sort((a, b) => a! - b!);

/** The tonal 6.5.1 chord symbol holding the same chord tones as each quality. */
const TONAL_CHORD: Record<QualityId, string> = {
	'7': '7',
	m7: 'm7',
	maj7: 'maj7',
	m7b5: 'm7b5',
	'7alt': '7alt',
	dim7: 'dim7',
	'6': '6',
	m6: 'm6',
	'7sus4': '7sus4'
};

describe('chordTones', () => {
	it('spells the same chord tones as tonal 6.5.1 Chord.get over every root', () => {
		for (const q of QUALITY_IDS) {
			if (q === '7alt') continue;
			for (const root of ROOTS) {
				// reference: tonal 6.5.1 Chord.get(root + symbol).notes
				expect(chordTones(q, root), `${root}${q}`).toEqual(Chord.get(root + TONAL_CHORD[q]).notes);
			}
		}
	});

	it('keeps 1 3 b7 for 7alt, a subset of tonal 1 3 #5 b7 #9 (REFERENCES.md §3)', () => {
		// reference: tonal 6.5.1 Chord.get('C7alt') is C E G# Bb D#; the altered scale adds the rest
		expect(chordTones('7alt', 'C')).toEqual(['C', 'E', 'Bb']);
		const tonal = Chord.get('C7alt').notes;
		for (const n of chordTones('7alt', 'C')) expect(tonal).toContain(n);
	});

	it.each([
		['m7b5', 'B', ['B', 'D', 'F', 'A']],
		['dim7', 'C#', ['C#', 'E', 'G', 'Bb']],
		['7sus4', 'Eb', ['Eb', 'Ab', 'Bb', 'Db']]
	] as const)('spells %s over %s as %j', (q, root, notes) => {
		expect(chordTones(q, root)).toEqual(notes);
	});
});

describe('chordScale', () => {
	it('holds the pitch classes of the tonal 6.5.1 scale it names, over every root', () => {
		for (const q of QUALITY_IDS) {
			const t = qualityTable(q);
			for (const root of ROOTS) {
				const ours = chordScale(q, root);
				// reference: tonal 6.5.1 Scale.get(`${root} ${name}`).notes
				const theirs = Scale.get(`${root} ${t.row.scale.tonal}`);
				expect(theirs.empty, t.row.scale.tonal).toBe(false);
				expect(chromas(ours.notes), `${root} ${q}`).toEqual(chromas(theirs.notes));
				expect(ours.semitones.length).toBe(theirs.notes.length);
			}
		}
	});

	it('spells the altered scale as tonal does and the diminished seventh degree as bb7', () => {
		// reference: tonal 6.5.1 Scale.get('C altered').notes
		expect(chordScale('7alt', 'C').notes).toEqual(Scale.get('C altered').notes);
		expect(chordScale('dim7', 'C').notes).toEqual(['C', 'D', 'Eb', 'F', 'Gb', 'Ab', 'Bbb', 'B']);
		expect(chordScale('dim7', 'C').degrees).toEqual([
			'R',
			'9',
			'b3',
			'11',
			'b5',
			'b13',
			'bb7',
			'7'
		]);
	});

	// Tensions and avoid notes: M. Levine, The Jazz Theory Book (1995), from memory; B. Nettles &
	// R. Graf, The Chord Scale Theory & Jazz Harmony (1997), from memory (REFERENCES.md §3 table).
	it.each([
		['maj7', 'Ionian', ['9', '13', '#11'], ['11']],
		['7', 'Mixolydian', ['9', '13', 'b9', '#9', '#11', 'b13'], ['11']],
		['m7', 'Dorian', ['9', '11', '13'], []],
		['m7b5', 'Locrian', ['11', 'b13', '9'], ['b9']],
		['dim7', 'whole-half diminished', ['9', '11', 'b13', '7'], []],
		['7alt', 'altered', ['b9', '#9', '#11', 'b13'], []],
		['6', 'Ionian', ['9', '#11', '7'], ['11']],
		['m6', 'melodic minor', ['9', '11', '7'], []],
		['7sus4', 'Mixolydian', ['9', '13'], ['3']]
	] as const)(
		'gives %s the %s scale, tensions %j and avoid notes %j',
		(q, name, tensions, avoid) => {
			const s = chordScale(q, 'C');
			expect(s.name).toBe(name);
			expect(s.tensions).toEqual(tensions);
			expect(s.avoid).toEqual(avoid);
		}
	);

	it('gives every note of each parent scale a role other than chromatic', () => {
		for (const q of QUALITY_IDS) {
			const t = qualityTable(q);
			for (const s of chordScale(q, 'C').semitones)
				expect(t.roles[s], `${q} ${s}`).not.toBe('chromatic');
		}
	});
});

describe('parseInterval', () => {
	it('agrees with tonal 6.5.1 Interval on steps and semitones', () => {
		const names = [
			'1P',
			'2m',
			'2M',
			'2A',
			'3m',
			'3M',
			'4P',
			'4A',
			'5d',
			'5P',
			'5A',
			'6m',
			'6M',
			'7d',
			'7m',
			'7M',
			'8P',
			'9M',
			'9A',
			'11A',
			'13M',
			'13m',
			'-2M',
			'-6m',
			'1A',
			'3dd'
		];
		for (const name of names) {
			const iv = Interval.get(name);
			// reference: tonal 6.5.1 Interval.get(name).semitones and .num
			expect(parseInterval(name), name).toEqual({
				steps: Math.sign(iv.num) * (Math.abs(iv.num) - 1),
				semitones: iv.semitones
			});
		}
	});

	it.each([['2P'], ['5M'], ['4m'], ['0P'], ['M3'], [''], ['x']])(
		'refuses %j with an error naming it',
		(name) => {
			expect(() => parseInterval(name)).toThrow(`'${name}'`);
		}
	);
});

describe('qualityTable', () => {
	it('names semitones by context: b3 and b5 on minor-third chords, bb7 on dim7, 6 on sixth chords', () => {
		expect(qualityTable('7').labels).toEqual([
			'R',
			'b9',
			'9',
			'#9',
			'3',
			'11',
			'#11',
			'5',
			'b13',
			'13',
			'b7',
			'7'
		]);
		expect(qualityTable('m7').labels[3]).toBe('b3');
		expect(qualityTable('m7b5').labels[6]).toBe('b5');
		expect(qualityTable('dim7').labels[9]).toBe('bb7');
		expect(qualityTable('6').labels[9]).toBe('6');
		expect(qualityTable('m6').labels[9]).toBe('6');
		expect(qualityTable('7alt').labels[3]).toBe('#9');
	});

	it('throws on an unknown quality, naming it', () => {
		expect(() => qualityTable('m9' as QualityId)).toThrow("'m9'");
		expect(isQualityId('m9')).toBe(false);
		expect(isQualityId('7alt')).toBe(true);
		expect(isQualityId(7)).toBe(false);
	});
});
