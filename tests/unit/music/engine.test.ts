import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import abcjs from 'abcjs';
import { Interval, Note } from 'tonal';
import { parseAbc } from '../../../src/lib/music/abc/parse';
import { tokenize } from '../../../src/lib/music/abc/tokenize';
import {
	computeGrid,
	computeVariant,
	prepareLick,
	renderVariant,
	type HandWrittenVersions,
	type VariantSuccess
} from '../../../src/lib/music/engine';
import { MAJOR_KEY_SPELLINGS } from '../../../src/lib/music/key-data';
import { QUALITY_IDS } from '../../../src/lib/music/types';

const HEAD = 'X:1\nT:Lick\nM:4/4\nL:1/8\n';
const variant = (
	abc: string,
	options: Parameters<typeof renderVariant>[1] & { versions?: HandWrittenVersions } = {}
): VariantSuccess => {
	const r = computeVariant({ abc, ...options });
	if (!r.ok) throw new Error(r.error.message);
	return r as VariantSuccess;
};
const reparse = (abc: string, prefix = '') => {
	const r = parseAbc(prefix + abc);
	if (!r.ok) throw new Error(`re-parse failed: ${r.error.message}\n${abc}`);
	return r.tune;
};
/** Melody pitches, onsets and durations as abcjs 6.7.2 plays them (`setUpAudio`). */
const abcjsNotes = (abc: string) => {
	const audio = abcjs.parseOnly(abc)[0].setUpAudio({});
	return (audio.tracks[0] as { cmd: string; pitch: number; start: number }[])
		.filter((e) => e.cmd === 'note')
		.map((e) => [Math.round(e.start * 1e5), e.pitch])
		.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
};

/** An invented four-bar dominant lick (ours, written for these tests). */
const LICK =
	HEAD + 'K:Bb\n"Bb7"B,DFA _A=GFD | "Eb7"E2 (3GB_d c>B G2 | "Bb7"F^FGA B2 z2 | "F7"A,CE_G F4 |]\n';

describe('computeVariant', () => {
	it('transposes "Bb7" up a tone to "C7" (REFERENCES.md §1, abc 2.1 §4.18)', () => {
		const v = variant(HEAD + 'K:Bb\n"Bb7"B2 d2 f2 _a2|\n', { to: 'C' });
		expect(v.abc).toBe(HEAD + 'K:C\n"C7"c2 e2 g2 _b2|\n');
		expect(v.key).toBe('C');
		expect(v.quality).toBe('7');
		expect(v.instrument).toBe('concert');
	});

	it('labels each sounding note with its pitch, MIDI number, degree and chord', () => {
		const v = variant(HEAD + 'K:C\n"D7"^F=FE_E D2 A,2|\n');
		// REFERENCES.md §3: over D7, F# F E Eb D are 3, #9, 9, b9, R
		expect(v.notes.map((n) => [n.pitch, n.midi, n.degree])).toEqual([
			['F#4', 66, '3'],
			['F4', 65, '#9'],
			['E4', 64, '9'],
			['Eb4', 63, 'b9'],
			['D4', 62, 'R'],
			['A3', 57, '5']
		]);
		expect(v.notes[0].chord).toMatchObject({ symbol: 'D7', root: 'D', quality: '7' });
		// pitch names agree with tonal 6.5.1 Note.midi
		for (const n of v.notes) expect(Note.midi(n.pitch)).toBe(n.midi);
		expect(v.devices?.map((d) => d.kind)).toContain('chromatic-fill');
	});

	it('labels tensions by semitones, not letters (REFERENCES.md §3, over E7)', () => {
		const v = variant(HEAD + 'K:C\n"E7"F G A c ^c|\n');
		expect(v.notes.map((n) => n.degree)).toEqual(['b9', '#9', '11', 'b13', '13']);
	});

	it('says what each degree is over the chord quality: chord tone, tension, avoid or chromatic', () => {
		// Common practice (Dorian over m7, Mixolydian over 7); tonal 6.5.1 Chord.get('Cm7').notes is
		// C Eb G Bb and Scale.get('C dorian').notes C D Eb F G A Bb, so E, Gb and B lie outside both.
		const minor = variant(HEAD + 'K:C\n"Cm7"C E _E G _G =B _B d f|\n');
		expect(minor.notes.map((n) => [n.degree, n.role])).toEqual([
			['R', 'chord-tone'],
			['3', 'chromatic'],
			['b3', 'chord-tone'],
			['5', 'chord-tone'],
			['b5', 'chromatic'],
			['7', 'chromatic'],
			['b7', 'chord-tone'],
			['9', 'tension'],
			['11', 'tension']
		]);
		// Over a dominant the 11 is the avoid note; before the first chord there is no degree at all.
		const dominant = variant(HEAD + 'K:C\nC "C7"E F|\n');
		expect(dominant.notes.map((n) => [n.degree, n.role])).toEqual([
			[null, null],
			['3', 'chord-tone'],
			['11', 'avoid']
		]);
	});

	it('re-maps over another quality and renames the chord symbol', () => {
		const v = variant(HEAD + 'K:C\n"D7"^F2 A2 c2 d2|\n', { quality: 'm7' });
		expect(v.abc).toContain('"Dm7"F2 A2 c2 d2|');
		expect(v.notes.map((n) => n.degree)).toEqual(['b3', '5', 'b7', 'R']);
		expect(v.quality).toBe('m7');
	});

	it('moves grace notes with the note they ornament when re-mapping', () => {
		// over D7 the grace F (a half step below the 3rd F#) stays a half step below the b3 of Dm7
		const v = variant(HEAD + 'K:C\n"D7"{=F}^F2 A2 d4|\n', { quality: 'm7' });
		expect(v.abc).toContain('"Dm7"{E}F2 A2 d4|');
	});

	it('writes for a transposing instrument in the written key and range (REFERENCES.md §4)', () => {
		// E-flat alto sax reads a major sixth above concert: concert C major is written A major
		const alto = variant(HEAD + 'K:C\n"C7"C E G _B|\n', { instrument: 'alto-sax' });
		expect(alto.writtenKey).toBe('A');
		expect(alto.abc).toContain('"A7"');
		expect(alto.notes.map((n) => n.pitch)).toEqual(['C4', 'E4', 'G4', 'Bb4']);
		// concert B is G# major for alto, written Ab with a warning (REFERENCES.md §2)
		const b = variant(HEAD + 'K:C\nC E G|\n', { to: 'B', instrument: 'alto-sax' });
		expect(b.writtenKey).toBe('Ab');
		expect(b.warnings.map((w) => w.code)).toContain('key-respelled');
		// B-flat tenor reads a major ninth up, guitar an octave up in treble-8, trombone in bass clef
		expect(variant(HEAD + 'K:C\nC|\n', { instrument: 'tenor-sax' }).writtenKey).toBe('D');
		expect(variant(HEAD + 'K:C\nC|\n', { instrument: 'guitar' }).writtenKey).toBe(
			'C clef=treble-8'
		);
		expect(variant(HEAD + 'K:C\nC|\n', { instrument: 'trombone' }).writtenKey).toBe('C clef=bass');
	});

	it('writes a derived tritone key by the tritone setting (concert E on B-flat trumpet is F# or Gb)', () => {
		const abc = HEAD + 'K:E\nEGB|\n';
		expect(variant(abc, { instrument: 'trumpet', tritone: 'Gb' }).writtenKey).toBe('Gb');
		expect(variant(abc, { instrument: 'trumpet', tritone: 'F#' }).writtenKey).toBe('F#');
		// the same sounds either way
		const a = variant(abc, { instrument: 'trumpet', tritone: 'Gb' });
		const b = variant(abc, { instrument: 'trumpet', tritone: 'F#' });
		const sounding = (v: VariantSuccess) => v.notes.map(({ writtenPitch: _, ...n }) => n);
		expect(sounding(a)).toEqual(sounding(b));
		// … and each part writes its own spelling (Gb4 or F#4 for concert E4)
		expect(a.notes[0].writtenPitch).toBe('Gb4');
		expect(b.notes[0].writtenPitch).toBe('F#4');
	});

	it('sounds the octave the instrument is written in when the range fit moves the line', () => {
		// Concert treble reads C4–C6 or so: a line around C6 is written an octave lower, and the
		// sounding notes (which playback uses) must follow the staff (abc 2.1 §4.1: c' is MIDI 84).
		const high = variant(HEAD + "K:C\nc'e'g'e'|\n", { instrument: 'concert' });
		const written = reparse(high.abc).notes.map((n) => n.midi);
		expect(high.notes.map((n) => n.midi)).toEqual(written);
		expect(written[0]).toBeLessThan(84);
		// For a transposing instrument the notes stay concert pitch, one fixed interval below the
		// staff: B-flat trumpet reads a major second above what sounds (REFERENCES.md §4).
		const trumpet = variant(HEAD + "K:C\nc'e'g'e'|\n", { instrument: 'trumpet' });
		const staff = reparse(trumpet.abc).notes.map((n) => n.midi);
		expect(trumpet.notes.map((n, i) => staff[i] - n.midi)).toEqual([2, 2, 2, 2]);
	});

	it("replaces the computed re-mapping with a teacher's hand-written version for that quality", () => {
		const lick = HEAD + 'K:C\n"C7"E2 G2 _B2 c2|\n';
		// The teacher prefers a different line over Cm7: written by hand, in the lick's key.
		const minor = HEAD + 'K:C\n"Cm7"_E2 F2 G2 _B2|\n';
		const v = variant(lick, { quality: 'm7', versions: { m7: minor }, to: 'F' });
		expect(v.handWritten).toBe(true);
		expect(v.quality).toBe('m7');
		expect(v.key).toBe('F');
		// Cm7 line moved up a fourth: Ab Bb C Eb over Fm7 (tonal Note.transpose('Eb4', '4P') = 'Ab4')
		expect(v.notes.map((n) => n.pitch)).toEqual(
			['Eb4', 'F4', 'G4', 'Bb4'].map((p) => Note.transpose(p, '4P'))
		);
		expect(v.abc).toContain('"Fm7"');
		// Other qualities are still computed from the original.
		const computed = variant(lick, { quality: 'maj7', versions: { m7: minor } });
		expect(computed.handWritten).toBe(false);
		expect(computed.notes.map((n) => n.pitch)).toEqual(['E4', 'G4', 'B4', 'C5']);
	});

	it('warns when a hand-written version is written over another quality than it is filed under', () => {
		const lick = HEAD + 'K:C\n"C7"E2 G2 _B2 c2|\n';
		const v = variant(lick, {
			quality: 'm7',
			versions: { m7: HEAD + 'K:C\n"Cmaj7"E2 G2 B2 c2|\n' }
		});
		expect(v.warnings.map((w) => w.code)).toContain('version-quality');
	});

	it('reports an error inside a hand-written version with its quality and position', () => {
		const r = computeVariant({
			abc: HEAD + 'K:C\n"C7"E2 G2|\n',
			versions: { m7: HEAD + 'K:C\n"Cm7 E2 G2|\n' }
		});
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.error.message).toMatch(/^In the hand-written m7 version: /);
		expect(r.error.line).toBe(6);
		const bad = computeVariant({
			abc: HEAD + 'K:C\nC|\n',
			versions: { bogus: 'X:1' } as HandWrittenVersions
		});
		expect(bad.ok).toBe(false);
		if (!bad.ok) expect(bad.error.message).toContain('“bogus”');
	});

	it('moves the line by whole octaves when asked', () => {
		const up = variant(HEAD + 'K:C\nCEG|\n', { to: 'D', octaves: 1 });
		expect(up.notes.map((n) => n.pitch)).toEqual(['D5', 'F#5', 'A5']);
		expect(up.abc).toContain('K:D\ndfa|');
	});

	it('spells the tritone key as asked, the same pitch classes either way', () => {
		const gb = variant(HEAD + 'K:C\nCEG|\n', { to: 'Gb' });
		const fs = variant(HEAD + 'K:C\nCEG|\n', { to: 'F#' });
		expect([gb.key, fs.key]).toEqual(['Gb', 'F#']);
		expect(gb.notes.map((n) => n.pitch)).toEqual(['Gb3', 'Bb3', 'Db4']);
		expect(fs.notes.map((n) => n.pitch)).toEqual(['F#4', 'A#4', 'C#5']);
		// Up to F# is an augmented fourth, up to Gb a diminished fifth (tonal 6.5.1 Interval.distance);
		// a fifth up is the longer way by letters, so Gb is reached a fourth down. The way back
		// reverses each move exactly, which the there-and-back property below relies on.
		expect(Interval.distance('C', 'F#')).toBe('4A');
		expect(Interval.distance('C', 'Gb')).toBe('5d');
	});

	it.each([
		[{ abc: 'X:1\nK:C\n"C7 abc' }, 3, 1, /closing double quote/],
		[{ abc: 'X:1\nK:C\n[CE' }, 3, 1, /never closed/],
		[{ abc: 'X:1\nK:Xyz\nC' }, 2, 3, /not a key/],
		[{ abc: 'X:1\nK:C\n' }, 3, 1, /no notes/],
		[{ abc: 'X:1\nK:C\nC ¿' }, 3, 3, /Unexpected character/]
	])('answers malformed abc with a positioned error (%#)', (request, line, column, message) => {
		const r = computeVariant(request);
		expect(r.ok).toBe(false);
		if (!r.ok) {
			expect(r.error).toMatchObject({ line, column });
			expect(r.error.message).toMatch(message);
		}
	});

	it.each([
		[{ to: 'H' }, /not a key/],
		[{ to: 'Cbb' }, /not a key/],
		[{ quality: 'maj9' }, /not a chord quality/],
		[{ instrument: 'kazoo' }, /not an instrument/],
		[{ tritone: 'G' }, /tritone/],
		[{ octaves: 1.5 }, /octave shift/],
		[{ octaves: 9 }, /octave shift/]
	])(
		'answers an unknown key, quality, instrument or tritone spelling with a message (%j)',
		(options, message) => {
			const r = computeVariant({ abc: LICK, ...(options as object) });
			expect(r.ok).toBe(false);
			if (!r.ok) expect(r.error.message).toMatch(message);
		}
	);

	it('refuses to re-map a lick without chord symbols, saying why', () => {
		const r = computeVariant({ abc: HEAD + 'K:C\nCEG|\n', quality: 'm7' });
		expect(!r.ok && r.error.message).toMatch(/no chord symbol/);
	});
});

describe('computeGrid', () => {
	it('renders every key × quality from one parse', () => {
		const grid = computeGrid(
			LICK,
			MAJOR_KEY_SPELLINGS,
			['7', 'm7', 'maj7', 'm7b5', '7alt', 'dim7', '6', 'm6'],
			'trumpet'
		);
		expect(grid.ok).toBe(true);
		if (!grid.ok) return;
		expect(grid.variants).toHaveLength(96);
		expect(new Set(grid.variants.map((v) => `${v.key} ${v.quality}`)).size).toBe(96);
		for (const v of grid.variants) expect(reparse(v.abc).notes).toHaveLength(v.notes.length);
	});

	it('reports a malformed lick once, with its position', () => {
		const grid = computeGrid('X:1\nK:C\n"C7', ['C'], ['7']);
		expect(grid.ok).toBe(false);
		if (!grid.ok) expect(grid.error).toMatchObject({ line: 3, column: 1 });
	});
});

// ---- property tests -----------------------------------------------------------------------

const KEY_FIELDS = [
	'C',
	'G',
	'D',
	'A',
	'E',
	'B',
	'F#',
	'F',
	'Bb',
	'Eb',
	'Ab',
	'Db',
	'Gb',
	'Am',
	'Em',
	'Dm',
	'Gm',
	'Cm',
	'F#m',
	'Dmix',
	'Ador',
	'Bbmix',
	'Edor'
];
const ROOTS = ['C', 'Db', 'D', 'Eb', 'E', 'F', 'F#', 'G', 'Ab', 'A', 'Bb', 'B'];
const SUFFIXES = ['7', 'm7', 'maj7', 'm7b5', '7alt', 'o7', '6', 'm6', '7(#11)', '7b9', '9', 'm9'];

const noteText = fc
	.record({
		acc: fc.constantFrom('', '', '', '', '^', '_', '='),
		letter: fc.constantFrom(...'CDEFGABcdefgab'),
		oct: fc.constantFrom('', '', '', ',', "'"),
		len: fc.constantFrom('', '', '', '2', '/', '3/2', '4')
	})
	.map(({ acc, letter, oct, len }) => {
		// keep within about three octaves: no ' on low letters' octave below, no , on high letters
		const o =
			oct === "'" && letter === letter.toUpperCase()
				? ''
				: oct === ',' && letter !== letter.toUpperCase()
					? ''
					: oct;
		return { pitch: acc + letter + o, len };
	});
const chordText = fc
	.record({
		root: fc.constantFrom(...ROOTS),
		suffix: fc.constantFrom(...SUFFIXES),
		slash: fc.constantFrom('', '', '', '/E', '/Bb')
	})
	.map(({ root, suffix, slash }) => `"${root}${suffix}${slash}"`);

const item = (rich: boolean) =>
	fc.oneof(
		{ weight: 10, arbitrary: noteText.map((n) => n.pitch + n.len) },
		{ weight: 2, arbitrary: fc.tuple(chordText, noteText).map(([c, n]) => c + n.pitch + n.len) },
		{ weight: 2, arbitrary: fc.constant(' | ') },
		{ weight: 1, arbitrary: fc.constant('z') },
		{ weight: 1, arbitrary: fc.tuple(noteText, noteText).map(([a, b]) => `${a.pitch}>${b.pitch}`) },
		{
			weight: 1,
			arbitrary: fc
				.tuple(noteText, noteText, noteText)
				.map(([a, b, c]) => `(3${a.pitch}${b.pitch}${c.pitch}`)
		},
		// a tie to the same note text in the same bar always joins the same pitch
		{ weight: 1, arbitrary: noteText.map((n) => `${n.pitch}2-${n.pitch.replace(/^[_^=]+/, '')}2`) },
		...(rich
			? [
					{
						weight: 1,
						arbitrary: fc.tuple(noteText, noteText).map(([g, n]) => `{${g.pitch}}${n.pitch}`)
					},
					{
						weight: 1,
						arbitrary: fc.tuple(noteText, noteText).map(([a, b]) => `[${a.pitch}${b.pitch}]2`)
					},
					{ weight: 1, arbitrary: fc.constantFrom('!trill!', '.', '~', '"^solo"', '% note\n') }
				]
			: [])
	);

const lickArb = (rich: boolean) =>
	fc
		.record({
			key: fc.constantFrom(...KEY_FIELDS),
			first: chordText,
			items: fc.array(item(rich), { minLength: 4, maxLength: 26 })
		})
		.map(({ key, first, items }) => `${HEAD}K:${key}\n${first}${items.join('')} |]\n`);

/** The text of every token that carries no pitch, chord symbol or key. */
const untouched = (abc: string) => {
	const r = tokenize(abc);
	if (!r.ok) throw new Error(r.error.message);
	return r.tokens
		.filter(
			(t) =>
				t.kind !== 'note' &&
				t.kind !== 'chord-symbol' &&
				!((t.kind === 'field' || t.kind === 'inline-field') && t.name === 'K')
		)
		.map((t) => t.text);
};

const constant = (a: number[], b: number[]) => {
	expect(a.length).toBe(b.length);
	const d = a[0] - b[0];
	for (let i = 0; i < a.length; i++) expect(a[i] - b[i], `note ${i}`).toBe(d);
	return d;
};

describe('properties of the twelve-key transposition', () => {
	it('re-parses every output, shifted by one constant interval, with the same degrees and rhythm', () => {
		fc.assert(
			fc.property(lickArb(true), (abc) => {
				const own = variant(abc);
				const source = reparse(abc);
				for (const to of MAJOR_KEY_SPELLINGS) {
					const v = variant(abc, { to });
					const again = reparse(v.abc);
					const shift = constant(
						again.notes.map((n) => n.midi),
						source.notes.map((n) => n.midi)
					);
					expect(Math.abs(shift)).toBeLessThanOrEqual(6);
					expect(again.notes.map((n) => n.midi)).toEqual(v.notes.map((n) => n.midi));
					expect(again.notes.map((n) => n.pitch)).toEqual(v.notes.map((n) => n.pitch));
					expect(again.notes.map((n) => [n.start, n.duration])).toEqual(
						source.notes.map((n) => [n.start, n.duration])
					);
					expect(v.notes.map((n) => n.degree)).toEqual(own.notes.map((n) => n.degree));
					// chord symbols move by the same interval (tonal 6.5.1 Interval.semitones of their roots)
					v.notes.forEach((n, i) => {
						const before = own.notes[i].chord;
						if (!n.chord || !before) return;
						const moved = Interval.semitones(Interval.distance(before.root, n.chord.root)) ?? NaN;
						expect((((moved - shift) % 12) + 12) % 12).toBe(0);
					});
					// the output reads the same under %%propagate-accidentals octave (abc 2.1 §11.3)
					expect(
						reparse(v.abc, '%%propagate-accidentals octave\n').notes.map((n) => n.midi)
					).toEqual(again.notes.map((n) => n.midi));
					// everything that is not a pitch, a chord symbol or a key is copied byte for byte
					expect(untouched(v.abc)).toEqual(untouched(abc));
					// grace notes move with the rest
					const graces = (t: ReturnType<typeof reparse>) =>
						t.heads.filter((h) => h.grace).map((h) => h.midi);
					const g = graces(again);
					graces(source).forEach((m, i) => expect(g[i] - m).toBe(shift));
				}
			}),
			{ numRuns: 40, seed: 20261201 }
		);
		// Forty whole grids: generous on a shared machine.
	}, 60_000);

	it('sounds in abcjs 6.7.2 what the engine says it sounds, in every key', () => {
		fc.assert(
			fc.property(lickArb(false), (abc) => {
				for (const to of ['C', 'Eb', 'F#', 'B']) {
					const v = variant(abc, { to });
					// reference: abcjs 6.7.2 setUpAudio; it reads accidentals by octave, our output is unambiguous
					const ours = v.notes
						.map((n) => [Math.round(n.start * 1e5), n.midi])
						.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
					expect(abcjsNotes(v.abc).map((x) => x[1])).toEqual(ours.map((x) => x[1]));
				}
			}),
			{ numRuns: 25, seed: 7 }
		);
	});

	it('comes back to the same pitches after going to any key and back', () => {
		fc.assert(
			fc.property(lickArb(true), fc.constantFrom(...MAJOR_KEY_SPELLINGS), (abc, to) => {
				const source = reparse(abc);
				const home = source.keys[0].key;
				const homeName = home.none
					? 'C'
					: 'CDEFGAB'[home.tonic.letter] +
						(home.tonic.alt > 0 ? '#' : home.tonic.alt < 0 ? 'b' : '');
				const there = variant(abc, { to });
				const back = variant(there.abc, { to: homeName });
				expect(back.notes.map((n) => n.midi)).toEqual(source.notes.map((n) => n.midi));
			}),
			{ numRuns: 150, seed: 99 }
		);
	});

	it('keeps degrees equal across the twelve keys for every quality', () => {
		fc.assert(
			fc.property(lickArb(false), fc.constantFrom(...QUALITY_IDS), (abc, quality) => {
				const prepared = prepareLick(abc);
				if (!prepared.ok) throw new Error(prepared.error.message);
				const base = renderVariant(prepared.lick, { quality });
				for (const to of MAJOR_KEY_SPELLINGS) {
					const v = renderVariant(prepared.lick, { quality, to });
					expect(v.notes.map((n) => n.degree)).toEqual(base.notes.map((n) => n.degree));
					constant(
						v.notes.map((n) => n.midi),
						base.notes.map((n) => n.midi)
					);
					expect(reparse(v.abc).notes.map((n) => n.midi)).toEqual(v.notes.map((n) => n.midi));
				}
			}),
			{ numRuns: 30, seed: 5 }
		);
	});
});

describe('a tie across a bar line', () => {
	const TIED = HEAD + 'K:C\n"C7"^G4- | G4 G2 A2 |]\n';

	it('carries its accidental through transposition, degrees and playback in every key', () => {
		// engraving practice (Gould, Behind Bars, from memory); reference: abcjs 6.7.2 setUpAudio
		for (const to of MAJOR_KEY_SPELLINGS) {
			const v = variant(TIED, { to });
			const [held, plain] = v.notes;
			expect(held.duration, to).toBe(1);
			// G# over C7 is the b13 a semitone above the 5 (REFERENCES.md §3)
			expect(held.degree, to).toBe('b13');
			expect(plain.degree, to).toBe('5');
			expect(held.midi - plain.midi, to).toBe(1);
			expect(reparse(v.abc).notes.map((n) => [n.midi, n.duration])).toEqual(
				v.notes.map((n) => [n.midi, n.duration])
			);
			expect(abcjsNotes(v.abc).map((x) => x[1])).toEqual(v.notes.map((n) => n.midi));
		}
	});

	it('gives no tie warning for it, and a sentence on the reading where octaves disagree', () => {
		expect(variant(TIED).warnings).toEqual([]);
		const v = variant(HEAD + 'K:C\n"C7"^c2 c2 C4 |]\n', { to: 'F' });
		const w = v.warnings.find((x) => x.code === 'accidental-reading');
		expect(w?.message).toContain('abc 2.1 §11.3');
		// the variant is written so that both readings agree (REFERENCES.md §1)
		expect(v.abc).toContain('"F7"_g2 g2 _G4');
	});
});
