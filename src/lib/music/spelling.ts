/**
 * Spelling choices: which enharmonic name a transposed note or key takes. Transposing by interval
 * keeps every letter relation of the original; this module only steps in where that gives a
 * needless double accidental, a key with more accidentals than its enharmonic twin (G# major →
 * Ab major), or an explicit accidental where a neighbouring letter sits in the key signature.
 */
import { fifthsOf, jazzTonic, keyOf, type KeySignature, type TritoneSpelling } from './keys';
import { MODE_FIFTHS } from './key-data';
import {
	chromaOf,
	formatNoteName,
	LETTER_SEMITONES,
	type SpelledNote,
	type SpelledPitch
} from './pitch';
import { modeSuffix } from './keys';
import type { MusicWarning } from './types';

/**
 * The enharmonic key with fewer accidentals, when there is one; a warning says what changed.
 * On a tie (F# / Gb major, six each) the spelling asked for stays, unless `ties` is 'setting':
 * then the tritone setting decides, without a warning (keys the engine derives itself, such as
 * a transposing instrument's written key, follow the learner's setting).
 * @example respellKey(keyOf('G#')) // { key: Ab major, warning: { code: 'key-respelled', … } }
 */
export function respellKey(
	key: KeySignature,
	tritone: TritoneSpelling = 'Gb',
	ties: 'keep' | 'setting' = 'keep'
): { key: KeySignature; warning: MusicWarning | null } {
	if (key.none) return { key, warning: null };
	const pc = chromaOf(key.tonic);
	const better = jazzTonic(pc, key.mode, tritone);
	const betterFifths = fifthsOf(better) + MODE_FIFTHS[key.mode];
	const gain = Math.abs(key.fifths) - Math.abs(betterFifths);
	const same = better.letter === key.tonic.letter && better.alt === key.tonic.alt;
	if (same || gain < 0 || (gain === 0 && ties === 'keep')) return { key, warning: null };
	const next = { ...keyOf(better, key.mode), rest: key.rest };
	if (gain === 0) return { key: next, warning: null };
	const from = formatNoteName(key.tonic) + modeSuffix(key.mode);
	const to = formatNoteName(better) + modeSuffix(key.mode);
	return {
		key: next,
		warning: {
			code: 'key-respelled',
			message: `${from} would need ${Math.abs(key.fifths)} ${key.fifths > 0 ? 'sharps' : 'flats'}; written in ${to} instead, which sounds the same.`
		}
	};
}

/**
 * Cost of writing a letter with an alteration in a key: an explicit accidental counts 1, E#, B#,
 * Cb and Fb outside the signature 1 more (they read as a different letter to most eyes), a
 * double accidental 2 more.
 * @example spellingCost(2, 1, keyOf('C').accidentals) // 2 (E#)
 */
export function spellingCost(letter: number, alt: number, accidentals: readonly number[]): number {
	let cost = 0;
	if (alt !== accidentals[letter]) {
		cost += 1;
		if (
			(alt === 1 && (letter === 2 || letter === 6)) ||
			(alt === -1 && (letter === 0 || letter === 3))
		)
			cost += 1;
	}
	if (alt >= 2 || alt <= -2) cost += 2;
	// abc has no triple sharp or flat (abc 2.1 §4.2): such a spelling must always give way.
	if (alt > 2 || alt < -2) cost += 100;
	return cost;
}

/**
 * Respell a transposed pitch when a neighbouring letter is cheaper to write in the key: no
 * double sharps or flats, no explicit E#/B#/Cb/Fb where F, C, B or E will do. A spelling that is
 * already as cheap as any other is kept (the same object), so letter relations survive wherever
 * they can. Runs once per note per variant: no allocation unless the spelling changes.
 * @example simplifySpelling({ letter: 3, alt: 2, octave: 4 }, keyOf('B').accidentals) // G4
 */
export function simplifySpelling(p: SpelledPitch, accidentals: readonly number[]): SpelledPitch {
	const own = spellingCost(p.letter, p.alt, accidentals);
	if (own === 0) return p;
	let bestCost = own;
	let bestLetter = -1;
	let bestAlt = 0;
	let bestOctave = 0;
	const midi = 12 * (p.octave + 1) + LETTER_SEMITONES[p.letter] + p.alt;
	// Neighbouring letters first; two letters away only rescues a spelling abc cannot write
	// (a double flat moved by a diminished second can need three flats: C-triple-flat is written A).
	const reach = p.alt > 2 || p.alt < -2 ? 2 : 1;
	for (let d = -reach; d <= reach; d++) {
		if (d === 0) continue;
		const abs = p.octave * 7 + p.letter + d;
		const letter = ((abs % 7) + 7) % 7;
		const octave = Math.floor(abs / 7);
		const alt = midi - (12 * (octave + 1) + LETTER_SEMITONES[letter]);
		if (alt > 2 || alt < -2) continue;
		const cost = spellingCost(letter, alt, accidentals);
		if (cost < bestCost) {
			bestCost = cost;
			bestLetter = letter;
			bestAlt = alt;
			bestOctave = octave;
		}
	}
	return bestLetter < 0 ? p : { letter: bestLetter, alt: bestAlt, octave: bestOctave };
}

/**
 * Respell a chord-symbol root or bass note in a key: like notes, but judged on the pitch class.
 * @example simplifyNoteName({ letter: 2, alt: 1 }, keyOf('C').accidentals) // F
 */
export function simplifyNoteName(n: SpelledNote, accidentals: readonly number[]): SpelledNote {
	const p = simplifySpelling({ letter: n.letter, alt: n.alt, octave: 4 }, accidentals);
	return p.letter === n.letter ? n : { letter: p.letter, alt: p.alt };
}
