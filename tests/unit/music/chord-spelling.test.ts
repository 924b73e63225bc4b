/**
 * Chord tones on the chord's letters: a note that is a chord tone of the chord in force is written
 * on the letter its interval gives above the root (the third two letters up…), whatever the key
 * signature (common practice). Reference: tonal 6.5.1 `Chord.get(symbol).notes`, run here.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Chord, Note } from 'tonal';
import { computeVariant, type VariantSuccess } from '../../../src/lib/music/engine';
import { parseAbc } from '../../../src/lib/music/abc/parse';
import { INSTRUMENT_IDS } from '../../../src/lib/music/instruments';

const HEAD = 'X:1\nM:4/4\nL:1/8\n';
const variant = (abc: string, options: Record<string, string | undefined> = {}): VariantSuccess => {
	const r = computeVariant({ abc, ...options });
	if (!r.ok) throw new Error(r.error.message);
	return r;
};
const pc = (pitch: string) => pitch.replace(/-?\d+$/, '');
/** The chord symbol without its bass: tonal reads `E7/G#` as an inversion, we want E7's tones. */
const head = (symbol: string) => symbol.split('/')[0];

/** Each chord-tone note's name, and the name tonal gives the chord tone of the same sound. */
function chordToneSpellings(v: VariantSuccess, written: boolean): [string, string][] {
	const out: [string, string][] = [];
	for (const n of v.notes) {
		const symbol = written ? n.writtenChord : n.chord?.symbol;
		if (n.role !== 'chord-tone' || !symbol) continue;
		const pitch = written ? n.writtenPitch : n.pitch;
		const tones = Chord.get(head(symbol)).notes;
		const same = tones.find((t) => Note.chroma(t) === Note.chroma(pitch));
		if (same) out.push([pc(pitch), same]);
	}
	return out;
}

describe('chord tones on the chord’s letters', () => {
	it.each([
		// The third of V7 in a minor key keeps its letter: B# over G#7 (tonal: G# B# D# F#).
		['K:C#m\n"G#7"G^B dB c4|]', '', '"G#7"G^B dB c4|]'],
		['K:C#m\n"G#7"G^B dB c4|]', 'D', '"A7"A^c ec d4|]'],
		// A secondary dominant's third: E7 in C has G#, never Ab.
		['K:C\n"E7"E_A B d c4|]', '', '"E7"E^G B d c4|]']
	])('%s to “%s” writes %s', (body, to, expected) => {
		const v = variant(HEAD + body + '\n', to ? { to } : {});
		expect(v.abc.split('\n').at(-2)).toBe(expected);
	});

	it.each([
		// The bass keeps its interval name from the root: E7/G# a major third up is G#7/B#.
		['K:C\n"E7/G#"^G4|]', 'E', 'G#7/B#'],
		['K:C\n"E7/G#"^G4|]', 'D', 'F#7/A#'],
		// A root is not written E#, B#, Cb or Fb unless the key is spelled so.
		['K:C\n"Bb7"_B4|]', 'Gb', 'E7'],
		// … and F# major is: its signature holds E#.
		['K:C\n"B7"B4|]', 'F#', 'E#7'],
		['K:Gb\n"Cb7"c4|]', undefined, 'Cb7']
	])('%s to %s gives the chord %s', (body, to, symbol) => {
		const v = variant(HEAD + body + '\n', to ? { to } : {});
		expect(v.notes[0].chord?.symbol).toBe(symbol);
	});

	it('spells every chord tone as tonal 6.5.1 Chord.get does, in every key, concert and written (fast-check, fixed seed)', () => {
		const roots = ['C', 'Db', 'D', 'Eb', 'E', 'F', 'F#', 'G', 'Ab', 'A', 'Bb', 'B'];
		const types = [
			'7',
			'm7',
			'maj7',
			'm7b5',
			'6',
			'm6',
			'7sus4',
			'7#9',
			'mMaj7',
			'9',
			'13',
			'7#11'
		];
		const keys = [
			'C',
			'F',
			'Bb',
			'Eb',
			'Ab',
			'Db',
			'Gb',
			'B',
			'E',
			'A',
			'D',
			'G',
			'F#',
			'C#m',
			'Ebm'
		];
		fc.assert(
			fc.property(
				fc.constantFrom(...keys),
				fc.constantFrom(...roots),
				fc.constantFrom(...types),
				fc.array(fc.tuple(fc.nat(6), fc.boolean()), { minLength: 2, maxLength: 8 }),
				fc.constantFrom(...keys.filter((k) => !k.endsWith('m'))),
				fc.constantFrom(...INSTRUMENT_IDS),
				(key, root, type, picks, to, instrument) => {
					const tones = Chord.get(root + type).notes;
					// Chord tones written with sharps or flats at random, as a careless source might.
					const body = picks
						.map(([k, sharp]) => {
							const midi = (Note.midi(tones[k % tones.length] + '4') as number) % 12;
							const name = Note.pitchClass(
								sharp ? Note.fromMidiSharps(60 + midi) : Note.fromMidi(60 + midi)
							);
							const acc = name.length > 1 ? (name[1] === '#' ? '^' : '_') : '=';
							return acc + name[0];
						})
						.join(' ');
					const abc = `${HEAD}K:${key}\n"${root}${type}"${body}|]\n`;
					expect(parseAbc(abc).ok).toBe(true);
					const v = variant(abc, { to: key.endsWith('m') ? undefined : to, instrument });
					for (const [ours, tonal] of chordToneSpellings(v, false)) expect(ours).toBe(tonal);
					for (const [ours, tonal] of chordToneSpellings(v, true)) expect(ours).toBe(tonal);
				}
			),
			{ seed: 7, numRuns: 400 }
		);
	}, 60_000);
});

describe('degrees from a chord’s own tones', () => {
	// tonal 6.5.1 ChordType.get: mMaj7 is 1P 3m 5P 7M, 7#9 is 1P 3M 5P 7m 9A, 13 adds 9M 13M.
	it.each([
		['CmMaj7', '_E', 'b3', 'chord-tone'],
		['CmMaj7', 'B', '7', 'chord-tone'],
		['C7#9', 'G', '5', 'chord-tone'],
		['C7#9', '^D', '#9', 'chord-tone'],
		['C13', 'A', '13', 'chord-tone'],
		['C7b13', '_A', 'b13', 'chord-tone']
	])('over %s, %s is the %s (%s)', (symbol, note, label, role) => {
		const v = variant(`${HEAD}K:C\n"${symbol}"${note}4|]\n`);
		expect([v.notes[0].degree, v.notes[0].role]).toEqual([label, role]);
	});

	it('keeps an unknown chord symbol as written, with a warning that names it', () => {
		const v = variant(`${HEAD}K:C\n"Cxyz"C4 "C7"E4|]\n`, { to: 'D' });
		expect(v.abc).toContain('"Cxyz"');
		expect(v.warnings.map((w) => w.code)).toContain('unknown-chord');
		expect(v.warnings.find((w) => w.code === 'unknown-chord')?.message).toContain('“Cxyz”');
	});
});
