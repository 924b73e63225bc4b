import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Chord, Interval, Note, Scale } from 'tonal';
import { degreeOf } from '../../../src/lib/music/degrees';
import { qualityTable } from '../../../src/lib/music/qualities';
import { remapNotes } from '../../../src/lib/music/remap';
import { QUALITY_IDS, type QualityId, type SoundingNote } from '../../../src/lib/music/types';
import { chordOf, lineOver } from './line-helper';

const pitchesOf = (symbol: string, line: string, to: QualityId) => {
	const notes = lineOver(symbol, line);
	return remapNotes(notes, { from: chordOf(symbol).quality!, to });
};
const codes = (r: { warnings: { code: string }[] }) => r.warnings.map((w) => w.code).sort();

describe('remapNotes through chord-scale degrees', () => {
	// REFERENCES.md §3 re-mapping table (common practice; scales confirmed with tonal Scale.get).
	// Each degree is mapped on its own, so no approach rule applies.
	it.each([
		['C4', 'R', 'R', 'R', 'R'],
		['Db4', 'b9', '9', '9', 'b9'],
		// The table allows b9 or 9 on m7b5; Locrian ♮2 keeps the 9 (Levine, from memory).
		['D4', '9', '9', '9', '9'],
		['D#4', '#9', 'b3', '9', 'b3'],
		['E4', '3', 'b3', '3', 'b3'],
		// Over maj7 the avoid 11 takes the Lydian #11 (Levine, from memory; tonal Scale.get('C lydian')).
		['F4', '11', '11', '#11', '11'],
		['F#4', '#11', '11', '#11', 'b5'],
		['G4', '5', '5', '5', 'b5'],
		['Ab4', 'b13', '13', '13', 'b13'],
		['A4', '13', '13', '13', 'b13'],
		['Bb4', 'b7', 'b7', '7', 'b7']
	])(
		'maps %s (the %s of C7) to the %s of Cm7, the %s of Cmaj7 and the %s of Cm7b5',
		(pitch, from, m7, maj7, m7b5) => {
			expect(degreeOf(pitch, chordOf('C7')).label).toBe(from);
			const expected = { m7, maj7, m7b5 } as const;
			for (const to of ['m7', 'maj7', 'm7b5'] as const) {
				const out = pitchesOf('C7', pitch, to).pitches[0];
				expect(degreeOf(out, chordOf('C' + to)).label, `${pitch} → C${to}`).toBe(expected[to]);
				expect(Math.abs(Note.midi(out)! - Note.midi(pitch)!)).toBeLessThanOrEqual(1);
			}
		}
	);

	it('spells moved chord tones by interval from the root, as tonal 6.5.1 Note.transpose does', () => {
		// reference: tonal 6.5.1 Note.transpose('A4', '3m') etc.
		const r = pitchesOf('A7', 'A4 C#5 E5 G5', 'm7b5');
		expect(r.pitches).toEqual(['A4', Note.transpose('A4', '3m'), Note.transpose('A4', '5d'), 'G5']);
		expect(pitchesOf('Ab7', 'Ab4 C5 Eb5 Gb5', 'maj7').pitches).toEqual(['Ab4', 'C5', 'Eb5', 'G5']);
		// Where tonal writes a double flat (Ab + 5d = Ebb), the line takes the plain letter.
		expect(Note.transpose('Ab4', '5d')).toBe('Ebb5');
		expect(pitchesOf('Ab7', 'Eb5', 'm7b5').pitches).toEqual(['D5']);
	});

	it('writes no double accidentals: the bb7 of Cdim7 is written A', () => {
		expect(pitchesOf('C7', 'Bb4', 'dim7').pitches).toEqual(['A4']);
		expect(pitchesOf('Gb7', 'Fb5', 'dim7').pitches).toEqual(['Eb5']);
	});

	it('returns the input unchanged when the quality does not change', () => {
		const notes = lineOver('D7', 'F#4 F4 E4 Eb4 D4');
		expect(remapNotes(notes, { from: '7', to: '7' })).toEqual({
			pitches: notes.map((n) => n.pitch),
			warnings: []
		});
		expect(remapNotes([], { from: '7', to: 'm7', root: 'C' })).toEqual({
			pitches: [],
			warnings: []
		});
	});
});

describe('remapNotes with approach and passing tones', () => {
	it('re-derives the D7 fill 3 → R on Dm7 and says one passing tone is too many', () => {
		// REFERENCES.md §3: a 3→R fill becomes b3→R, a minor third with room for one passing tone fewer
		const r = pitchesOf('D7', 'F#4 F4 E4 Eb4 D4', 'm7');
		expect(r.pitches).toEqual(['F4', 'F4', 'E4', 'Eb4', 'D4']);
		expect(codes(r)).toEqual(['collision', 'fill-too-long']);
		const fill = r.warnings.find((w) => w.code === 'fill-too-long')!;
		expect(fill.notes).toEqual([0, 1, 2, 3, 4]);
		expect(fill.message).toContain('one passing tone is too many');
		// The matching major third on Dm7 is 5 → b3 (REFERENCES.md §3: A Ab G Gb F).
		expect(fill.message).toContain('5 → b3');
		expect(r.warnings.find((w) => w.code === 'collision')!.notes).toEqual([0, 1]);
	});

	it('keeps the same fill whole on Dmaj7, where the 3 and R do not move', () => {
		const r = pitchesOf('D7', 'F#4 F4 E4 Eb4 D4', 'maj7');
		expect(r).toEqual({ pitches: ['F#4', 'F4', 'E4', 'Eb4', 'D4'], warnings: [] });
	});

	it('re-derives the Dm7 fill 5 → b3 on D7, where it spans a minor third', () => {
		const r = pitchesOf('Dm7', 'A4 Ab4 G4 Gb4 F4', '7');
		expect(r.pitches).toEqual(['A4', 'A4', 'Ab4', 'G4', 'F#4']);
		expect(codes(r)).toEqual(['collision', 'fill-too-long']);
	});

	it('says where a fill grows and leaves a gap (b3 → R on Dm7 becomes 3 → R on D7)', () => {
		const r = pitchesOf('Dm7', 'F4 E4 Eb4 D4', '7');
		expect(r.pitches).toEqual(['F#4', 'E4', 'Eb4', 'D4']);
		expect(codes(r)).toEqual(['fill-gap']);
	});

	it.each([
		['Ab4 G4', 'Ab4 G4', 'a b13 leading down to the 5 stays a half step above it'],
		['Db4 C4', 'Db4 C4', 'a b9 leading to the root stays a half step above it'],
		['D#4 E4', 'D4 Eb4', 'a #9 leading up to the 3 follows it down to the b3'],
		['F4 E4', 'F4 Eb4', 'the 11 moving to the 3 is a scale step and stays the 11'],
		['Eb4 C#4 D4', 'Eb4 C#4 D4', 'a chromatic enclosure of the 9 keeps its shape']
	])('over C7 → Cm7 maps %s to %s: %s', (line, expected) => {
		expect(pitchesOf('C7', line, 'm7').pitches).toEqual(expected.split(' '));
	});

	it('keeps a chromatic enclosure of the root whole over every target', () => {
		for (const to of QUALITY_IDS)
			expect(pitchesOf('D7', 'Eb4 C#4 D4', to).pitches, to).toEqual(['Eb4', 'C#4', 'D4']);
	});

	it('spells approach tones from below on the sharp side and from above on the flat side', () => {
		expect(pitchesOf('F7', 'G#4 A4', 'm7').pitches).toEqual(['G4', 'Ab4']);
		expect(pitchesOf('C7', 'B4 Bb4', 'maj7').pitches).toEqual(['C5', 'B4']);
		expect(pitchesOf('D7', 'Eb4 D4', 'm7').pitches).toEqual(['Eb4', 'D4']);
	});
});

describe('remapNotes warnings', () => {
	it('calls #9 over maj7 ambiguous: 9 or a blue note leading to the 3', () => {
		const r = pitchesOf('C7', 'Eb5', 'maj7');
		expect(r.pitches).toEqual(['D5']);
		expect(r.warnings).toEqual([
			expect.objectContaining({
				code: 'ambiguous',
				notes: [0],
				message: expect.stringContaining('blue note')
			})
		]);
	});

	it('sends the 9 to the #9 or b9 of the altered scale the way the line moves, and says so', () => {
		expect(pitchesOf('C7', 'D4 E4', '7alt').pitches).toEqual(['Eb4', 'E4']);
		expect(pitchesOf('C7', 'D4 C4', '7alt').pitches).toEqual(['Db4', 'C4']);
		expect(codes(pitchesOf('C7', 'D4 C4', '7alt'))).toEqual(['ambiguous']);
	});

	it('warns when two consecutive notes collide into one pitch', () => {
		// Seven notes of Mixolydian into the seven of the altered scale, which has no 5 and two 2s.
		const r = pitchesOf('C7', 'C4 D4 E4 F4 G4 A4 Bb4', '7alt');
		expect(r.pitches).toEqual(['C4', 'Eb4', 'E4', 'Gb4', 'Ab4', 'Ab4', 'Bb4']);
		expect(r.warnings.filter((w) => w.code === 'collision').map((w) => w.notes)).toEqual([[4, 5]]);
	});

	it('gives a tie its second home when the first would collide (5 → #11 before 13 → b13)', () => {
		const r = pitchesOf('C7', 'G4 A4 Bb4', '7alt');
		expect(r.pitches).toEqual(['Gb4', 'Ab4', 'Bb4']);
		expect(codes(r)).toEqual(['ambiguous']);
	});

	it('moves a note to its second home when the first collides (13 → b13 next to b7 → bb7 on dim7)', () => {
		const r = pitchesOf('C7', 'G4 A4 Bb4 C5', 'dim7');
		expect(r.pitches).toEqual(['Gb4', 'Ab4', 'A4', 'C5']);
		expect(codes(r)).toEqual([]);
	});

	it('moves the colour aside, not the chord tone, when a 7 and a 13 would meet on the bb7', () => {
		// found by the property below: Emaj7 → Edim7, D#5 (7 → bb7) then C#5 (13, already bb7)
		const r = pitchesOf('Emaj7', 'D#5 C#5 G3', 'dim7');
		expect(r.pitches).toEqual(['C#5', 'C5', 'G3']);
		expect(codes(r)).toEqual([]);
	});

	it('never moves the end of a re-derived fill aside, so the fill stays one direction', () => {
		// C7 → C7alt: the 5 (G) could be b13 or #11; it ends the fill Bb A Ab G, so it stays put
		const r = pitchesOf('C7', 'Bb4 A4 Ab4 G4 F4', '7alt');
		const midis = r.pitches.map((p) => Note.midi(p)!);
		for (let i = 0; i + 1 < 4; i++) expect(midis[i + 1]).toBeLessThanOrEqual(midis[i]);
	});

	it('warns about a long note landing on an avoid note of the target (the 11 of a sixth chord)', () => {
		// Levine, from memory: 11 is the avoid note over a tonic major chord; a tension over Dorian.
		const notes = lineOver('Cm7', 'G4 F4');
		notes[1] = { ...notes[1], duration: 0.5 };
		const r = remapNotes(notes, { from: 'm7', to: '6' });
		expect(r.pitches).toEqual(['G4', 'F4']);
		expect(r.warnings).toEqual([expect.objectContaining({ code: 'avoid-note', notes: [1] })]);
		expect(codes(remapNotes(lineOver('Cm7', 'G4 F4'), { from: 'm7', to: '6' }))).toEqual([]);
	});
});

describe('remapNotes across a progression', () => {
	it('leaves notes under another chord of the progression as written, and says so', () => {
		const notes = lineOver(['Dm7', 'G7'], 'F4 A4 C5 | B4 D5 F5 G5');
		const r = remapNotes(notes, { from: '7', to: 'm7', root: 'G' });
		expect(r.pitches).toEqual(['F4', 'A4', 'C5', 'Bb4', 'D5', 'F5', 'G5']);
		expect(r.warnings).toEqual([
			expect.objectContaining({ code: 'other-chord-kept', notes: [0, 1, 2] })
		]);
	});

	it('maps notes under another chord of the source quality relative to their own root', () => {
		const notes = lineOver(['G7', 'C7'], 'B4 D5 | E5 G5');
		expect(remapNotes(notes, { from: '7', to: 'm7' }).pitches).toEqual(['Bb4', 'D5', 'Eb5', 'G5']);
	});

	it('uses options.root for notes before the first chord', () => {
		const notes = lineOver(null, 'E4 G4');
		expect(remapNotes(notes, { from: '7', to: 'm7', root: 'C' }).pitches).toEqual(['Eb4', 'G4']);
	});

	it('throws when no root is known, since the caller must name the home chord', () => {
		expect(() => remapNotes(lineOver(null, 'E4'), { from: '7', to: 'm7' })).toThrow('options.root');
		expect(() => remapNotes(lineOver('C7', 'E4'), { from: '7', to: 'm9' as QualityId })).toThrow(
			"'m9'"
		);
	});
});

describe('remapNotes properties', () => {
	const ROOTS = ['C', 'Db', 'D', 'Eb', 'E', 'F', 'F#', 'G', 'Ab', 'A', 'Bb', 'B'];
	const line = fc.array(fc.integer({ min: 55, max: 79 }), { minLength: 1, maxLength: 26 });
	const quality = fc.constantFrom(...QUALITY_IDS);

	function notesFor(midis: number[], root: string, q: QualityId): SoundingNote[] {
		const chord = { symbol: root + q, root, quality: q, bass: null };
		return midis.map((midi, index) => ({
			index,
			pitch: Note.fromMidi(midi),
			midi,
			start: index / 8,
			duration: 1 / 8,
			chord
		}));
	}

	it('gives one well-spelled pitch per note, within a whole step, never a double accidental', () => {
		fc.assert(
			fc.property(line, fc.constantFrom(...ROOTS), quality, quality, (midis, root, from, to) => {
				const r = remapNotes(notesFor(midis, root, from), { from, to });
				expect(r.pitches).toHaveLength(midis.length);
				r.pitches.forEach((p, i) => {
					expect(p).toMatch(/^[A-G](#|b)?-?\d$/);
					expect(Math.abs(Note.midi(p)! - midis[i])).toBeLessThanOrEqual(2);
				});
			}),
			{ numRuns: 1000 }
		);
	});

	it('commutes with transposition: the same line a few semitones up moves the same way', () => {
		fc.assert(
			fc.property(line, fc.integer({ min: 0, max: 11 }), quality, quality, (midis, k, from, to) => {
				const a = remapNotes(notesFor(midis, 'C', from), { from, to }).pitches.map((p) =>
					Note.midi(p)!
				);
				const b = remapNotes(
					notesFor(
						midis.map((m) => m + k),
						ROOTS[k],
						from
					),
					{ from, to }
				).pitches.map((p) => Note.midi(p)!);
				expect(b).toEqual(a.map((m) => m + k));
			}),
			{ numRuns: 1000 }
		);
	});

	it('keeps every chord tone a chord tone where the target has one of the same number', () => {
		fc.assert(
			fc.property(line, quality, quality, (midis, from, to) => {
				const notes = notesFor(midis, 'E', from);
				const r = remapNotes(notes, { from, to });
				const target = { symbol: 'E' + to, root: 'E', quality: to, bass: null };
				notes.forEach((n, i) => {
					const before = degreeOf(n.pitch, n.chord!);
					// The 5 of 7alt and the 3 of 7sus4 do not exist: those stay where the scale puts them.
					const home = qualityTable(to).chordToneByNumber[before.number];
					if (before.role === 'chord-tone' && home !== undefined)
						expect(degreeOf(r.pitches[i], target).role, `${n.pitch} ${from}→${to}`).toBe(
							'chord-tone'
						);
				});
			}),
			{ numRuns: 1000 }
		);
	});
});

describe('remapNotes as a teacher would write it', () => {
	// The twelve roots as jazz charts spell them (common practice; REFERENCES.md §2).
	const ROOTS = ['C', 'Db', 'D', 'Eb', 'E', 'F', 'Gb', 'G', 'Ab', 'A', 'Bb', 'B'];
	const pc = (p: string) => p.replace(/-?\d+$/, '');
	const arpeggio = (root: string) =>
		['1P', '3M', '5P', '7m'].map((iv) => Note.transpose(root + '4', iv)).join(' ');

	it.each([
		['6', 'the sixth replaces the seventh (C E G A)'],
		['m6', 'the sixth replaces the seventh over the minor third (C Eb G A)'],
		['7sus4', 'the fourth replaces the third (C F G Bb)']
	])(
		'plays a dominant arpeggio over %s in every key as tonal 6.5.1 Chord.get spells it: %s',
		(q) => {
			for (const root of ROOTS) {
				const r = remapNotes(lineOver(root + '7', arpeggio(root)), {
					from: '7',
					to: q as QualityId
				});
				// reference: tonal 6.5.1 Chord.get('<root><quality>').notes (run), in the chord's own order
				// (the engine writes no double accidentals: tonal's Bbb over Gbm6 is compared as A)
				const expected = Chord.get(root + q).notes.map((n) =>
					/bb|##/.test(n) ? Note.simplify(n) : n
				);
				expect(r.pitches.map(pc), `${root}7 → ${root}${q}`).toEqual(expected);
				expect(r.warnings, `${root}${q}`).toEqual([]);
			}
		}
	);

	it('turns the avoid 11 into the Lydian #11 over maj7, in every key', () => {
		// Levine, The Jazz Theory Book, from memory: a line re-mapped onto major takes Lydian;
		// reference: tonal 6.5.1 Scale.get('<root> lydian').notes[3] (run)
		for (const root of ROOTS) {
			const line = ['5P', '4P', '3M'].map((iv) => Note.transpose(root + '4', iv)).join(' ');
			const r = remapNotes(lineOver(root + '7', line), { from: '7', to: 'maj7' });
			expect(pc(r.pitches[1]), root).toBe(Scale.get(root + ' lydian').notes[3]);
			expect(r.pitches[0]).toBe(line.split(' ')[0]);
		}
	});

	it('keeps the spelling of a blue note that keeps its pitch (Eb over C7 stays Eb over C6), in every key', () => {
		// common practice: the blue third is written as a minor third above the root
		for (const root of ROOTS) {
			const blue = Note.transpose(root + '4', '3m');
			const line = [blue, Note.transpose(root + '4', '3M'), Note.transpose(root + '4', '5P')];
			for (const to of ['6', 'maj7', '7sus4'] as const) {
				const r = remapNotes(lineOver(root + '7', line.join(' ')), { from: '7', to });
				if (Note.midi(r.pitches[0]) === Note.midi(blue))
					expect(r.pitches[0], `${root}7 → ${to}`).toBe(blue);
			}
			const six = remapNotes(lineOver(root + '7', line.join(' ')), { from: '7', to: '6' });
			expect(six.pitches[0], root).toBe(blue);
		}
	});

	it('keeps a chromatic approach rather than repeat a note: G A Bb C over C7 is G A B C over C6', () => {
		// common practice: the b7 of a dominant line becomes the 6 over a sixth chord, unless the
		// line already holds that 6 next to it; then the scale's 7 keeps the step.
		expect(pitchesOf('C7', 'G4 A4 Bb4 C5', '6').pitches).toEqual(['G4', 'A4', 'B4', 'C5']);
		expect(pitchesOf('C7', 'G4 A4 Bb4 C5', 'm6').pitches).toEqual(['G4', 'A4', 'B4', 'C5']);
		// the 3 of C7 moving to the 11 stays a passing 3 over C7sus4 instead of doubling the 4
		expect(pitchesOf('C7', 'D4 E4 F4 G4', '7sus4').pitches).toEqual(['D4', 'E4', 'F4', 'G4']);
		expect(codes(pitchesOf('C7', 'G4 A4 Bb4 C5', '6'))).toEqual([]);
		// a #9 approaching the 3 follows the 3 onto the 4 of the sus chord
		expect(pitchesOf('C7', 'Eb4 E4', '7sus4').pitches).toEqual(['E4', 'F4']);
	});

	it('never turns an approach into a repeated note where the line had none, over every quality and key', () => {
		const line = fc.array(fc.integer({ min: 55, max: 79 }), { minLength: 2, maxLength: 16 });
		fc.assert(
			fc.property(
				line,
				fc.constantFrom(...ROOTS),
				fc.constantFrom(...QUALITY_IDS),
				(midis, root, to) => {
					const notes = lineOver(root + '7', midis.map((m) => Note.fromMidi(m)).join(' '));
					const r = remapNotes(notes, { from: '7', to });
					const out = r.pitches.map((p) => Note.midi(p)!);
					// Any repeat the re-mapping makes is said in a warning (a collision or a fill that cannot survive).
					for (let i = 0; i + 1 < out.length; i++)
						if (out[i] === out[i + 1] && midis[i] !== midis[i + 1])
							expect(
								r.warnings.some((w) => w.notes?.includes(i) && w.notes.includes(i + 1)),
								`${root}7 → ${to}: ${notes.map((n) => n.pitch).join(' ')} → ${r.pitches.join(' ')}`
							).toBe(true);
				}
			),
			{ numRuns: 500, seed: 7 }
		);
	});

	it('says so when a chromatic fill cannot survive over 7sus4 (no 3 to land on)', () => {
		const r = pitchesOf('C7', 'G4 Gb4 F4 E4', '7sus4');
		const lost = r.warnings.find((w) => w.code === 'fill-lost');
		expect(lost?.message).toContain('cannot survive over C7sus4');
		expect(lost?.message).toContain('no 3');
		expect(lost?.notes).toEqual([0, 1, 2, 3]);
		expect(codes(pitchesOf('C7', 'E4 Eb4 D4 Db4 C4', '7sus4'))).toContain('fill-lost');
	});

	it('writes the chromatic notes it moved on the side their gesture leans, never G♭ beside D♯', () => {
		// common practice: one gesture is written on one side; the chord's tensions (the b5 of
		// C7alt is G♭, altered scale after tonal 6.5.1 Scale.get('C altered')) set the side.
		const lean = (root: string, p: string): number => {
			const q = Interval.get(Interval.distance(root, pc(p))).q;
			return q === 'm' || q === 'd' ? -1 : q === 'A' ? 1 : 0;
		};
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: 55, max: 79 }), { minLength: 2, maxLength: 12 }),
				fc.constantFrom(...ROOTS),
				fc.constantFrom(...QUALITY_IDS),
				fc.constantFrom(...QUALITY_IDS),
				fc.boolean(),
				(midis, root, from, to, sharps) => {
					const line = midis.map((m) => (sharps ? Note.fromMidiSharps(m) : Note.fromMidi(m)));
					const notes = lineOver(root + from, line.join(' '));
					const r = remapNotes(notes, { from, to });
					const target = chordOf(root + to);
					const tensions = r.pitches
						.filter((p) => degreeOf(p, target).role === 'tension')
						.map((p) => lean(root, p))
						.reduce((a, b) => a + b, 0);
					if (tensions === 0) return;
					r.pitches.forEach((p, i) => {
						if (Note.midi(p) === midis[i] || degreeOf(p, target).role !== 'chromatic') return;
						const other = Note.enharmonic(p);
						// only where the other side needs no double accidental
						if (/##|bb/.test(other) || other === p) return;
						expect(
							lean(root, p),
							`${root}${from} → ${to}: ${line.join(' ')} → ${r.pitches.join(' ')}`
						).not.toBe(-Math.sign(tensions));
					});
				}
			),
			{ numRuns: 1000, seed: 11 }
		);
	});
});
