/**
 * Warnings speak of the variant shown: the chord and note names in every warning move with the
 * variant, in the written pitch of a transposing instrument (alto saxophone reads a major sixth
 * above concert: REFERENCES.md §4, MusicXML 4.0 <transpose> -9).
 */
import { describe, expect, it } from 'vitest';
import { Note } from 'tonal';
import { computeVariant, type VariantSuccess } from '../../../src/lib/music/engine';
import { plainText, speakText } from '../../../src/lib/music/speech';
import type { MusicWarning } from '../../../src/lib/music/types';

/** Ours: a 3 → R chromatic fill over G7, a note over C7, then the 11 held over G7. */
const LICK = 'X:1\nM:4/4\nL:1/8\nK:G\n"G7"B _B A _A G2 "C7"E2 | "G7"c4 z4|]\n';
const TWELVE = ['C', 'Db', 'D', 'Eb', 'E', 'F', 'Gb', 'G', 'Ab', 'A', 'Bb', 'B'];

/** Warnings of re-mapping (the key and range ones differ by key for reasons of their own). */
const REMAP = [
	'fill-too-long',
	'fill-gap',
	'ambiguous',
	'avoid-note',
	'collision',
	'other-chord-kept'
];
const fromRemap = (w: MusicWarning) => REMAP.includes(w.code);
const variant = (options: Record<string, string>): VariantSuccess => {
	const r = computeVariant({ abc: LICK, ...options });
	if (!r.ok) throw new Error(r.error.message);
	return r;
};
const NAME = /\b([A-G](?:##|bb|#|b)?)(-?\d+|maj7|m7b5|m7|7alt|7sus4|dim7|m6|6|7)(?![\w#])/g;
/** A message with every note and chord name cut out, and the pitch classes of those names. */
function names(message: string): { frame: string; chromas: number[] } {
	const chromas: number[] = [];
	const frame = message.replace(NAME, (_, root: string) => {
		chromas.push(Note.chroma(root) as number);
		return '·';
	});
	return { frame, chromas };
}

describe('warnings in the variant’s own names', () => {
	it('fills a template with a variant’s names, and reads it plainly as written', () => {
		const template = 'over ⟦k|G7⟧ the ⟦s2|A4⟧ becomes ⟦o2|Ab4⟧';
		expect(plainText(template)).toBe('over G7 the A4 becomes Ab4');
		const speaker = {
			chord: (s: string) => s.replace('G', 'A'),
			source: () => 'B4',
			output: () => 'Bb4'
		};
		expect(speakText(template, speaker)).toBe('over A7 the B4 becomes Bb4');
	});

	it.each(['m7', 'm7b5', 'dim7', 'm6', '7sus4'] as const)(
		'moves every name in every %s warning with the key and the instrument (all twelve keys)',
		(quality) => {
			const home = variant({ quality });
			expect(home.warnings.length).toBeGreaterThan(0);
			const base = home.warnings.filter(fromRemap).map((w) => names(w.message));
			for (const to of TWELVE)
				for (const [instrument, offset] of [
					['concert', 0],
					['alto-sax', 9]
				] as const) {
					const v = variant({ quality, to, instrument });
					const shift = (Note.chroma(to) as number) - 7 + offset;
					const moved = v.warnings.filter(fromRemap).map((w) => names(w.message));
					expect(moved.map((m) => m.frame)).toEqual(base.map((b) => b.frame));
					moved.forEach((m, i) =>
						expect(m.chromas).toEqual(base[i].chromas.map((c) => (((c + shift) % 12) + 12) % 12))
					);
				}
		}
	);

	it('never names the home chord in a warning of another key (D, re-mapped to m7)', () => {
		const v = variant({ quality: 'm7', to: 'D' });
		const text = v.warnings.map((w) => w.message).join(' ');
		expect(text).toContain('Dm7');
		expect(text).not.toMatch(/\bG(m)?7\b/);
	});
});
