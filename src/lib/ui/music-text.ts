/**
 * Display helpers for music text on screen: real accidental signs instead of abc/ASCII spelling,
 * and the few header values the player needs from returned abc. Pure and framework-free.
 */

import { beatsPerBar, readTempo } from '$lib/music/meter';

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
	return symbol
		.replace(/^([A-G])([b#])/, (_, letter: string, a: 'b' | '#') => letter + SIGN[a])
		.replace(/\/([A-G])([b#])/, (_, letter: string, a: 'b' | '#') => `/${letter}${SIGN[a]}`)
		.replace(/([b#])(?=\d)/g, (a) => SIGN[a as 'b' | '#']);
}

/**
 * A degree label with signs; a dash for none.
 * @example degreeForDisplay('b13') // '♭13'
 */
export function degreeForDisplay(label: string | null): string {
	if (!label) return '–';
	return label.replace(/^bb/, '♭♭').replace(/^b/, '♭').replace(/^#/, '♯');
}

/**
 * Quarter-note tempo from an abc text's `Q:` field, for text that has no engine answer (a
 * variant answer carries `tempo`); `fallback` without one. Reading is `readTempo`'s.
 * @example tempoFromAbc('X:1\nQ:1/4=132\nK:C\nc') // 132
 */
export function tempoFromAbc(abc: string, fallback = 120): number {
	const m = /^Q:(.*)$/m.exec(abc);
	return (m && readTempo(m[1])) ?? fallback;
}

/**
 * Count-in beats from an abc text's `M:` field, for text that has no engine answer (a variant
 * answer carries `beatsPerBar`). Reading is `beatsPerBar`'s.
 * @example countInBeats('M:6/8\nK:G') // 2
 */
export function countInBeats(abc: string): number {
	const m = /^M:(.*)$/m.exec(abc);
	return beatsPerBar(m ? m[1] : '');
}
