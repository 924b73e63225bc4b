/**
 * Display helpers for music text on screen: real accidental signs instead of abc/ASCII spelling.
 * Meter and tempo come with the engine's answer (`beatsPerBar`, `tempo`), never from the text.
 * Pure and framework-free.
 */

import { chordTemplate } from '$lib/music/chord-symbol';
import { formatNoteName } from '$lib/music/pitch';

const SIGN = { b: '♭', '#': '♯' } as const;

/**
 * A note name with signs and without its octave (the staff shows where it sits).
 * @example noteForDisplay('Bb4') // 'B♭'
 */
export function noteForDisplay(pitch: string): string {
	const m = /^([A-Ga-g])(bb|##|b|#|)(-?\d+)?$/.exec(pitch.trim());
	if (!m) return pitch;
	// Two signs rather than U+1D12B/U+1D12A: Nunito and most system fonts have no glyph for the
	// musical-symbols block, so 𝄫 would show as an empty box.
	const accidental = { bb: '♭♭', '##': '♯♯', b: '♭', '#': '♯', '': '' }[
		m[2] as 'bb' | '##' | 'b' | '#' | ''
	];
	return m[1].toUpperCase() + accidental;
}

/**
 * A chord symbol or key name with signs on its root, its bass and its alterations.
 * @example chordForDisplay('Bb7#11/Db') // 'B♭7♯11/D♭'
 */
export function chordForDisplay(symbol: string): string {
	// Roots and bass notes as the one chord-symbol reader finds them; alterations in the rest.
	const t = chordTemplate(symbol);
	let out = alterations(t.pieces[0]);
	t.roots.forEach((r, i) => {
		out += noteForDisplay(formatNoteName(r)) + alterations(t.pieces[i + 1]);
	});
	return out;
}

const alterations = (text: string): string =>
	text.replace(/([b#])(?=\d)/g, (a) => SIGN[a as 'b' | '#']);

/**
 * A degree label with signs; a dash for none.
 * @example degreeForDisplay('b13') // '♭13'
 */
export function degreeForDisplay(label: string | null): string {
	if (!label) return '–';
	return label.replace(/^bb/, '♭♭').replace(/^b/, '♭').replace(/^#/, '♯');
}
