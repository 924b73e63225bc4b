/**
 * Display helpers for music text on screen: real accidental signs instead of abc/ASCII spelling,
 * and the few header values the player needs from returned abc. Pure and framework-free.
 */

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
 * Quarter-note tempo from an abc `Q:` field (abc 2.1 §3.1.8: `Q:1/4=120`, or a bare number,
 * read here as beats of a quarter); `fallback` without one.
 * @example tempoFromAbc('X:1\nQ:1/4=132\nK:C\nc') // 132
 */
export function tempoFromAbc(abc: string, fallback = 120): number {
	const m = /^Q:\s*(?:(\d+)\/(\d+)\s*=\s*)?(\d+)\s*$/m.exec(abc);
	if (!m) return fallback;
	const bpm = Number(m[3]);
	// A tempo given for another beat (Q:3/8=60) becomes quarters per minute.
	const beat = m[1] ? Number(m[1]) / Number(m[2]) : 0.25;
	const quarters = (bpm * beat) / 0.25;
	return Number.isFinite(quarters) && quarters > 0 ? Math.round(quarters) : fallback;
}

/**
 * Beats of a count-in bar from the `M:` field (abc 2.1 §3.1.6): the numerator in x/4, the
 * dotted-quarter pulse in compound x/8, two per half in x/2; `C` and `C|` count four.
 * @example countInBeats('M:6/8\nK:G') // 2
 */
export function countInBeats(abc: string): number {
	const m = /^M:\s*(\S+)/m.exec(abc);
	if (!m) return 4;
	if (m[1] === 'C' || m[1] === 'C|') return 4;
	const [num, den] = m[1].split('/').map(Number);
	if (!(num > 0 && num <= 12)) return 4;
	if (den === 4) return num;
	if (den === 8) return num % 3 === 0 ? num / 3 : num;
	if (den === 2) return num * 2;
	return 4;
}
