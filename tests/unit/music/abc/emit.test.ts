import { describe, expect, it } from 'vitest';
import { emitAbc, transposeChordSymbol } from '../../../../src/lib/music/abc/emit';
import { parseAbc, type ParsedAbc } from '../../../../src/lib/music/abc/parse';
import { keyOf } from '../../../../src/lib/music/keys';
import { computeVariant } from '../../../../src/lib/music/engine';

const parse = (text: string): ParsedAbc => {
	const r = parseAbc(text);
	if (!r.ok) throw new Error(r.error.message);
	return r.tune;
};
/** Re-emit without changing any pitch, key or chord symbol. */
const identity = (text: string): string => {
	const t = parse(text);
	return emitAbc(t, {
		keys: t.keys.map((k) => k.key),
		pitches: t.heads.map((h) => h.pitch),
		chordSymbols: t.chordSymbols.map((c) => c.text)
	});
};
const variant = (abc: string, to?: string) => {
	const r = computeVariant({ abc, to });
	if (!r.ok) throw new Error(r.error.message);
	return r;
};
const body = (abc: string) =>
	abc
		.split('\n')
		.filter((l) => !/^[A-Za-z]:/.test(l) && l !== '')
		.join('\n');
const HEAD = 'X:1\nT:Lick\nM:4/4\nL:1/8\n';
const midisUnder = (abc: string, mode: 'pitch' | 'octave') =>
	parse(`%%propagate-accidentals ${mode}\n` + abc).notes.map((n) => n.midi);

describe('abc emitter', () => {
	it('re-emits untouched abc byte for byte: comments, spacing, decorations, lengths, line ends', () => {
		const text =
			'%abc-2.1\r\nX:1 % first\r\nT:Lick\r\nM:4/4\r\nL:1/8\r\nK:Bb clef=treble\r\n"Bb7"!trill!B,2 (3DF_A .c>d [CEG]2- | [CEG] {/g}f4 z2 "^solo"x2 :|\\\r\n% between\r\n|: a\'b,, ~c/ d// e3/2 |]\r\n';
		expect(identity(text)).toBe(text);
	});

	it('adds a courtesy accidental where the pitch and octave readings differ (abc 2.1 §11.3)', () => {
		const out = identity(HEAD + 'K:C\n^c c C | c\n');
		// REFERENCES.md §1: the input means C#5 C#5 C#4 | C5 (the §11.3 default); the C#4 gets its own sharp
		expect(body(out)).toBe('^c c ^C | c');
		expect(midisUnder(out, 'pitch')).toEqual([73, 73, 61, 72]);
		expect(midisUnder(out, 'octave')).toEqual([73, 73, 61, 72]);
		const natural = identity(HEAD + 'K:C\n^c =C C c | c\n');
		expect(body(natural)).toBe('^c =C C =c | c');
		expect(midisUnder(natural, 'octave')).toEqual(midisUnder(natural, 'pitch'));
	});

	it('writes natural signs where the new key signature needs them', () => {
		// K:C ^f f | f down a tone: F# → E (natural in Bb major needs =), F → Eb (in the signature)
		const v = variant(HEAD + 'K:C\n^f f | f\n', 'Bb');
		expect(v.abc).toContain('K:Bb\n');
		expect(body(v.abc)).toBe('=e e | e');
	});

	it('drops accidentals the new key signature already gives and adds them where it does not', () => {
		// C to G is down a fourth (the shorter way); F natural needs = in G major, F# does not
		const v = variant(HEAD + 'K:C\nF ^F G _B | B\n', 'G');
		expect(body(v.abc)).toBe('C ^C D =F | F');
		expect(v.notes.map((n) => n.pitch)).toEqual(['C4', 'C#4', 'D4', 'F4', 'F#4']);
	});

	it('writes a conventional key signature and the fewest accidentals, no needless doubles', () => {
		// D# (the b7 of F7 spelled sharp) would become G## in B: written A; the bar's =a carries on
		const v = variant(HEAD + 'K:F\n"F7"F A c _e ^d2 e2|\n', 'B');
		expect(v.abc).toContain('K:B\n');
		expect(body(v.abc)).toBe('"B7"B d f =a a2 a2|');
		expect(v.notes.map((n) => n.pitch)).toEqual(['B4', 'D#5', 'F#5', 'A5', 'A5', 'A5']);
		// G# major would need 8 sharps: Ab is written instead, with a warning
		const g = variant(HEAD + 'K:C\nCEG^G|\n', 'G#');
		expect(g.abc).toContain('K:Ab\n');
		expect(body(g.abc)).toBe('A,CE=E|');
		expect(g.warnings.map((w) => w.code)).toContain('key-respelled');
	});

	it('moves inline key changes and keeps clef settings', () => {
		const v = variant(HEAD + 'K:G clef=treble\nF [K:D]F | c\n', 'A');
		expect(v.abc).toContain('K:A clef=treble\n');
		expect(body(v.abc)).toBe('G [K:E]G | d');
	});

	it('transposes grace notes and leaves rests, decorations, slurs and tuplets alone', () => {
		const v = variant(HEAD + 'K:C\n!trill!{/e}d2 (3(cde) z2 .c>B|]\n', 'D');
		expect(body(v.abc)).toBe('!trill!{/f}e2 (3(def) z2 .d>c|]');
	});

	it.each([
		// REFERENCES.md §1 (abc 2.1 §4.18): "Bb7" up a tone is "C7"; slash chords and alterations kept
		['Bb7', 'C7', 'C'],
		['Bb7/D', 'C7/E', 'C'],
		['Bb7(#11)', 'C7(#11)', 'C'],
		['Bbm7b5', 'Cm7b5', 'C'],
		['Ebmaj7/G', 'Fmaj7/A', 'C'],
		['(F7)', '(G7)', 'C'],
		['Db7', 'Eb7', 'C']
	])('transposes the chord symbol "%s" up a tone to "%s" in %s', (symbol, expected, key) => {
		expect(transposeChordSymbol(symbol, { steps: 1, semitones: 2 }, keyOf(key).accidentals)).toBe(
			expected
		);
	});

	it('spells chord symbols to match the key', () => {
		// up an augmented fourth from C: F7 → B7 in F#, D7 → G#7; in Gb the same roots read Cb7, Ab7
		const sharp = variant(HEAD + 'K:C\n"F7"F2 "D7"D2|\n', 'F#');
		expect(sharp.abc).toContain('"B7"B2 "G#7"G2|');
		const flat = variant(HEAD + 'K:C\n"F7"F2 "D7"D2|\n', 'Gb');
		expect(flat.abc).toContain('"Cb7"C2 "Ab7"A,2|');
	});

	it('transposes every chord of a symbol that names two, and reads the first as the chord in force', () => {
		const v = variant(HEAD + 'K:C\n"Dm7 G7"D2 G2|\n', 'F');
		expect(v.abc).toContain('"Gm7 C7"G2 c2|');
		expect(v.notes[0].chord).toMatchObject({ root: 'G', quality: 'm7' });
	});

	it('transposes a tune without key signature (K:none) with explicit accidentals only', () => {
		const v = variant(HEAD + 'K:none\nC ^F _B B|\n', 'D');
		expect(v.abc).toContain('K:none\n');
		expect(body(v.abc)).toBe('D ^G c c|');
		expect(v.key).toBe('D');
	});

	it('leaves annotations and text that is not a chord untouched', () => {
		const v = variant(HEAD + 'K:C\n"^solo"C "N.C."D "Coda"E "_low"F|\n', 'D');
		expect(body(v.abc)).toBe('"^solo"D "N.C."E "Coda"F "_low"G|');
	});
});
