import { describe, expect, it } from 'vitest';
import abcjs from 'abcjs';
import { AbcNotation, Note } from 'tonal';
import {
	defaultUnitLength,
	lengthMultiplier,
	parseAbc,
	type ParsedAbc
} from '../../../../src/lib/music/abc/parse';
import { parseChordSymbol } from '../../../../src/lib/music/chord-symbol';

const tune = (text: string): ParsedAbc => {
	const r = parseAbc(text, (s) => parseChordSymbol(s));
	if (!r.ok) throw new Error(`${r.error.line}:${r.error.column} ${r.error.message}`);
	return r.tune;
};
const head = (key = 'C', extra = 'M:4/4\nL:1/8\n') => `X:1\nT:Test\n${extra}K:${key}\n`;
const pitches = (music: string, key = 'C', extra?: string) =>
	tune(head(key, extra) + music + '\n').notes.map((n) => n.pitch);
const errorOf = (text: string) => {
	const r = parseAbc(text);
	if (r.ok) throw new Error('expected an error');
	return r.error;
};

describe('abc parser', () => {
	it('reads octaves as abc 2.1 §4.1 and tonal AbcNotation do', () => {
		const abc = ['C,', 'C', 'c', "c'", '_B,', '^f', "=e''"];
		for (const a of abc) {
			const [p] = pitches(a);
			// reference: tonal 6.5.1 AbcNotation.abcToScientificNotation
			expect(p, a).toBe(AbcNotation.abcToScientificNotation(a.replace('=', '')));
		}
		// abc 2.1 §4.1: C is middle C, MIDI 60; C, is 48; c' is 84
		expect(tune(head() + "C C, c'\n").notes.map((n) => n.midi)).toEqual([60, 48, 84]);
	});

	it('applies the key signature, including modes (abc 2.1 §3.1.14)', () => {
		expect(pitches('FcB', 'G')).toEqual(['F#4', 'C5', 'B4']);
		expect(pitches('FcB', 'Dmix')).toEqual(['F#4', 'C5', 'B4']);
		expect(pitches('FcB', 'Ador')).toEqual(['F#4', 'C5', 'B4']);
		expect(pitches('BEA', 'BbMix')).toEqual(['Bb4', 'Eb4', 'Ab4']);
		expect(pitches('BEF', 'D Phr ^f')).toEqual(['Bb4', 'Eb4', 'F#4']);
		expect(pitches('FC', 'D =c')).toEqual(['F#4', 'C4']);
	});

	it('reaches accidentals across the bar by letter in every octave by default (abc 2.1 §11.3 pitch)', () => {
		// REFERENCES.md §1: K:C ^c c C | c → C#5 C#5 C#4 | C5 under `pitch`
		expect(pitches('^c c C | c')).toEqual(['C#5', 'C#5', 'C#4', 'C5']);
	});

	it('follows %%propagate-accidentals octave and not (abc 2.1 §11.3)', () => {
		const octave = tune('%%propagate-accidentals octave\n' + head() + '^c c C | c\n');
		expect(octave.notes.map((n) => n.pitch)).toEqual(['C#5', 'C#5', 'C4', 'C5']);
		const not = tune('%%propagate-accidentals not\n' + head() + '^c c C | c\n');
		expect(not.notes.map((n) => n.pitch)).toEqual(['C#5', 'C5', 'C4', 'C5']);
	});

	it('lets a natural sign cancel the key signature until the bar line', () => {
		expect(pitches('=F F f | F', 'G')).toEqual(['F4', 'F4', 'F5', 'F#4']);
	});

	it.each([
		// abc 2.1 §3.1.7: L: defaults from M: (below 0.75 → 1/16, else 1/8; C, C| and none → 1/8)
		['2/4', 1 / 16],
		['3/4', 1 / 8],
		['6/8', 1 / 8],
		['4/4', 1 / 8],
		['5/8', 1 / 16],
		['C', 1 / 8],
		['C|', 1 / 8],
		['none', 1 / 8],
		['', 1 / 8]
	])('takes the default unit length for M:%s as %d', (meter, unit) => {
		expect(defaultUnitLength(meter)).toBe(unit);
		const t = tune(`X:1\n${meter ? `M:${meter}\n` : ''}K:C\nC\n`);
		expect(t.notes[0].duration).toBe(unit);
	});

	it.each([
		// abc 2.1 §4.3 with L:1/8: A2 a quarter, A/ a sixteenth, A3/2 a dotted eighth
		['', 1],
		['2', 2],
		['/', 1 / 2],
		['//', 1 / 4],
		['/2', 1 / 2],
		['3/2', 3 / 2],
		['/4', 1 / 4],
		['0', null],
		['3/0', null],
		// Beyond 128 times or 1/128 of the unit: a typing slip, refused (our own bound).
		['128', 128],
		['129', null],
		['99999999999999', null],
		['/128', 1 / 128],
		['/256', null]
	])('reads the length %j as %d units', (text, mult) => {
		expect(lengthMultiplier(text)).toBe(mult);
	});

	it('refuses absurd lengths with a positioned sentence instead of a days-long note', () => {
		expect(errorOf(head() + 'C99999999999999|\n')).toMatchObject({ line: 6, column: 1 });
		expect(errorOf('X:1\nL:1/1000000\nK:C\nC|\n').message).toMatch(/L:1\/512/);
		expect(errorOf('X:1\nL:4\nK:C\nC|\n').message).toMatch(/L:1\/1 to L:1\/512/);
		expect(errorOf(head() + 'Z99999|\n').message).toMatch(/1 to 999/);
		// The bounds themselves are fine: L:1/512, a 128-unit note, 999 bars of rest.
		expect(tune('X:1\nL:1/512\nK:C\nC128 Z999|\n').notes[0].duration).toBeCloseTo(1 / 4, 10);
	});

	it('times notes, broken rhythm, tuplets, rests and chords', () => {
		const t = tune(head() + 'A2 A/ A3/2 a>b c<d (3cde [CEG]2 z (3:2:2ab c\n');
		const d = t.notes.map((n) => n.duration);
		// abc 2.1 §4.3, §4.4 (a>b is 3:1), §4.13 ((3 = three in the time of two), §4.17
		const expected = [1 / 4, 1 / 16, 3 / 16, 3 / 16, 1 / 16, 1 / 16, 3 / 16];
		expected.forEach((v, i) => expect(d[i]).toBeCloseTo(v, 10));
		expect(d.slice(7, 10).reduce((a, b) => a + b, 0)).toBeCloseTo(1 / 4, 10);
		for (const n of t.notes.slice(10, 13)) expect(n.start).toBeCloseTo(1.25, 10);
		expect(t.notes.slice(10, 13).map((n) => n.duration)).toEqual([1 / 4, 1 / 4, 1 / 4]);
		// the rest takes an eighth; (3:2:2 puts 3 in the time of 2 for two notes only
		expect(t.notes[13].start).toBeCloseTo(1.625, 10);
		expect(t.notes[15].start).toBeCloseTo(1.625 + 1 / 6, 10);
		expect(t.notes[13].duration).toBeCloseTo(1 / 12, 10);
		expect(t.notes[15].duration).toBeCloseTo(1 / 8, 10);
	});

	it('times a chord by its first note and its own length (abc 2.1 §4.17)', () => {
		// the first note's length sets the chord's; every note of the chord sounds that long here
		const t = tune(head() + '[C2E4G] [CEG]3/2 c\n');
		expect(t.notes.map((n) => [n.pitch, n.start, n.duration])).toEqual([
			['C4', 0, 1 / 4],
			['E4', 0, 1 / 4],
			['G4', 0, 1 / 4],
			['C4', 1 / 4, 3 / 16],
			['E4', 1 / 4, 3 / 16],
			['G4', 1 / 4, 3 / 16],
			['C5', 1 / 4 + 3 / 16, 1 / 8]
		]);
	});

	it.each([
		// abc 2.1 §4.13: (p without q is p in the time of 3 for 2, 4, 8; of 2 for 3, 6; and for 5, 7, 9
		// of 3 in compound meter, else 2
		['4/4', '(2ab', 2, 3 / 2],
		['4/4', '(4abcd', 4, 3 / 4],
		['4/4', '(5abcde', 5, 2 / 5],
		['6/8', '(5abcde', 5, 3 / 5],
		['4/4', '(6abcdef', 6, 2 / 6],
		['9/8', '(7abcdefg', 7, 3 / 7]
	])('in M:%s reads %s as p notes in the time of q', (meter, music, count, each) => {
		const t = tune(`X:1\nM:${meter}\nL:1/8\nK:C\n${music} c\n`);
		t.notes.slice(0, count).forEach((n) => expect(n.duration).toBeCloseTo(each / 8, 10));
		expect(t.notes[count].duration).toBe(1 / 8);
	});

	it('reads a>>b as 7:1 and a<b as 1:3 (abc 2.1 §4.4)', () => {
		const t = tune(head() + 'a>>b a<b\n');
		expect(t.notes.map((n) => n.duration * 8)).toEqual([7 / 4, 1 / 4, 1 / 2, 3 / 2]);
	});

	it('merges ties, across bar lines too, but not a tie after a space (abc 2.1 §4.11)', () => {
		const t = tune(head() + 'c4- | c4 c4 -c4 | ^f2- f2\n');
		expect(t.notes.map((n) => [n.pitch, n.duration])).toEqual([
			['C5', 1],
			['C5', 1 / 2],
			['C5', 1 / 2],
			['F#5', 1 / 2]
		]);
		expect(t.heads.filter((h) => h.continuation)).toHaveLength(2);
	});

	it('warns when a tie joins different pitches, reading them as two notes', () => {
		const t = tune(head('G') + '^f2- | f2\n');
		expect(t.notes.map((n) => [n.pitch, n.duration])).toEqual([['F#5', 1 / 2]]);
		const u = tune(head() + '^f2- | =f2\n');
		expect(u.notes.map((n) => n.pitch)).toEqual(['F#5', 'F5']);
		expect(u.warnings.map((w) => w.code)).toContain('tie-unmatched');
	});

	it('carries a tied accidental over the bar line for the tied note only: ^G-|G is one G#', () => {
		// engraving practice (E. Gould, Behind Bars, 2011, from memory); reference: abcjs 6.7.2
		// setUpAudio plays ^G4-|G4 G4 as G#4 for a whole note, then G4 (run)
		const t = tune(head() + '^G4- | G4 G4 |]\n');
		expect(t.notes.map((n) => [n.pitch, n.duration])).toEqual([
			['G#4', 1],
			['G4', 1 / 2]
		]);
		expect(t.warnings).toEqual([]);
		const audio = abcjs.parseOnly(head() + '^G4- | G4 G4 |]\n')[0].setUpAudio({});
		const played = (audio.tracks[0] as { cmd: string; pitch: number; duration: number }[])
			.filter((e) => e.cmd === 'note')
			.map((e) => [e.pitch, e.duration]);
		expect(played).toEqual(t.notes.map((n) => [n.midi, n.duration]));
		// in a chord, and with a key signature's flat tied the other way
		expect(tune(head() + '[^GB]4- | [GB]4 |]\n').notes.map((n) => n.pitch)).toEqual(['G#4', 'B4']);
		expect(tune(head('F') + '=B4- | B4 B4 |]\n').notes.map((n) => n.pitch)).toEqual(['B4', 'Bb4']);
	});

	it('warns where a note reads differently by letter and by octave (abc 2.1 §11.3), naming the reading used', () => {
		// REFERENCES.md §1: K:C ^c c C → C#4 under `pitch` (the default, used), C4 under `octave`
		const t = tune(head() + '^c c C | c\n');
		expect(t.notes.map((n) => n.pitch)).toEqual(['C#5', 'C#5', 'C#4', 'C5']);
		const w = t.warnings.filter((x) => x.code === 'accidental-reading');
		expect(w).toHaveLength(1);
		expect(w[0].message).toContain('Line 6, column 6');
		expect(w[0].message).toContain('“C” sounds C♯4');
		expect(w[0].message).toContain('which is how it is read here');
		expect(w[0].message).toContain('Write ^C or =C');
		// none where both readings agree, or where the lick says which it uses
		expect(tune(head() + '^c c ^C C | c\n').warnings).toEqual([]);
		expect(tune(head() + '^c c | C\n').warnings).toEqual([]);
		const declared = tune('%%propagate-accidentals octave\n' + head() + '^c c C | c\n');
		expect(declared.warnings).toEqual([]);
	});

	it('keeps grace notes out of the timing but reads their pitches', () => {
		const t = tune(head() + '{ag}f2 g\n');
		expect(t.notes.map((n) => [n.pitch, n.start])).toEqual([
			['F5', 0],
			['G5', 0.25]
		]);
		expect(t.heads.filter((h) => h.grace).map((h) => h.midi)).toEqual([81, 79]);
	});

	it('gives each note the chord symbol in force, and annotations are not chords (abc 2.1 §4.18, §4.19)', () => {
		const t = tune(head() + 'C "Bb7#11/D"D "^solo"E "Am7"F G\n');
		expect(t.notes.map((n) => n.chord?.symbol ?? null)).toEqual([
			null,
			'Bb7#11/D',
			'Bb7#11/D',
			'Am7',
			'Am7'
		]);
		expect(t.notes[1].chord).toMatchObject({ root: 'Bb', quality: '7', bass: 'D' });
	});

	it('changes key with an inline field and with a K: line in the body', () => {
		expect(pitches('F [K:Bb] B E | F', 'G')).toEqual(['F#4', 'Bb4', 'Eb4', 'F4']);
		expect(pitches('F\nK:F\nB', 'G')).toEqual(['F#4', 'Bb4']);
	});

	it('joins continued lines and skips comment lines (abc 2.1 §2.2.5, §2.2.6)', () => {
		const joined = pitches('abc \\\ncba|');
		expect(joined).toEqual(pitches('abc cba|'));
		expect(pitches('ab\n% a comment\ncd')).toEqual(['A5', 'B5', 'C5', 'D5']);
	});

	it('reads two tunes, each with its own key (abc 2.1 §2.2)', () => {
		const t = tune('X:1\nT:One\nK:C\nF\n\nX:2\nT:Two\nK:G\nF\n');
		expect(t.notes.map((n) => n.pitch)).toEqual(['F4', 'F#4']);
	});

	it('warns about unknown header fields and goes on (abc 2.1 §3)', () => {
		const t = tune('X:1\nJ:foo\nK:C\nC\n');
		expect(t.warnings.map((w) => w.code)).toEqual(['unknown-field']);
		expect(t.notes).toHaveLength(1);
	});

	it('keeps decorations, slurs and repeats out of the pitches', () => {
		expect(pitches('|: !trill!c .d ~e (fg) :|1 a :|2 b |]')).toEqual([
			'C5',
			'D5',
			'E5',
			'F5',
			'G5',
			'A5',
			'B5'
		]);
	});

	it.each([
		['X:1\nK:C\n', 3, 1, /no notes/],
		['X:1\nK:C\nz4 |\n', 3, 1, /no notes/],
		['X:1\nK:Hm\nC\n', 2, 3, /not a key/],
		['X:1\nK:D Phr ^z\nC\n', 2, 9, /accidental/],
		['X:1\nM:4/x\nK:C\nC\n', 2, 1, /not a meter/],
		['X:1\nL:1/0\nK:C\nC\n', 2, 1, /not a note length/],
		['X:1\nT:x\n', 1, 1, /No K: line/],
		['', 1, 1, /No K: line/],
		['CDEF', 1, 1, /No K: line/],
		['X:1\nK:C\n>C\n', 3, 1, /broken rhythm/],
		['X:1\nK:C\nC>\n', 3, 2, /broken rhythm/],
		['X:1\nK:C\n[K:Q]C\n', 3, 4, /not a key/]
	])('refuses %j with a positioned message', (text, line, column, message) => {
		const e = errorOf(text);
		expect(e.message).toMatch(message);
		expect([e.line, e.column]).toEqual([line, column]);
	});

	it('sounds what abcjs 6.7.2 sounds for a lick without octave-ambiguous accidentals', () => {
		const text = head('Bb') + '"Bb7"B,DFA _A=G^FF | (3cBA G>F [DF]2 z2 | d4- d2 c2 |]\n';
		const ours = tune(text).notes.map((n) => [n.midi, n.start, n.duration]);
		// reference: abcjs 6.7.2 parseOnly(...)[0].setUpAudio() (melody track)
		const audio = abcjs.parseOnly(text)[0].setUpAudio({});
		const theirs = (
			audio.tracks[0] as { cmd: string; pitch: number; start: number; duration: number }[]
		)
			.filter((e) => e.cmd === 'note')
			.map((e) => [e.pitch, e.start, e.duration]);
		expect(ours.length).toBe(theirs.length);
		ours.forEach((o, i) => {
			expect(o[0], `note ${i}`).toBe(theirs[i][0]);
			// abcjs rounds its times to six decimals
			expect(o[1]).toBeCloseTo(theirs[i][1], 5);
			expect(o[2]).toBeCloseTo(theirs[i][2], 5);
		});
		// and every pitch name agrees with tonal 6.5.1 Note.midi
		for (const n of tune(text).notes) expect(Note.midi(n.pitch)).toBe(n.midi);
	});
});
