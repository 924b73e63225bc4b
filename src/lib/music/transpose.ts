/**
 * Transposition by interval, not by semitone count, so that letters stay right (tonal
 * `Note.transpose` is the reference in tests). The interval runs from the lick's own key (its
 * first K: tonic) to the target key, by the shorter way; an octave shift moves it further.
 */
import { jazzTonic, keyOf, type KeySignature, type TritoneSpelling } from './keys';
import {
	LETTER_SEMITONES,
	stepsBetween,
	transposePitch,
	type SpelledNote,
	type SpelledPitch,
	type Steps
} from './pitch';
import { respellKey, simplifySpelling } from './spelling';
import type { MusicWarning } from './types';

export const UNISON: Steps = { steps: 0, semitones: 0 };

/**
 * Add two intervals.
 * @example addSteps({ steps: 1, semitones: 2 }, { steps: 2, semitones: 3 }) // { steps: 3, semitones: 5 }
 */
export function addSteps(a: Steps, b: Steps): Steps {
	return { steps: a.steps + b.steps, semitones: a.semitones + b.semitones };
}

/**
 * The interval from one tonic to another by the shorter way (up to a tritone up, otherwise down).
 * @example intervalToKey({ letter: 0, alt: 0 }, { letter: 6, alt: -1 }) // { steps: -1, semitones: -2 }
 */
export function intervalToKey(from: SpelledNote, to: SpelledNote): Steps {
	const up = stepsBetween(from, to);
	if (up.semitones > 6 || (up.semitones === 6 && up.steps > 3)) {
		return { steps: up.steps - 7, semitones: up.semitones - 12 };
	}
	return up;
}

/**
 * Transpose a pitch class by an interval (letters move by the interval's steps).
 * @example transposeNoteName({ letter: 6, alt: -1 }, { steps: 1, semitones: 2 }) // { letter: 0, alt: 0 }
 */
export function transposeNoteName(n: SpelledNote, by: Steps): SpelledNote {
	const abs = n.letter + by.steps;
	const letter = ((abs % 7) + 7) % 7;
	const octaves = Math.floor(abs / 7);
	const natural = LETTER_SEMITONES[letter] + 12 * octaves - LETTER_SEMITONES[n.letter];
	return { letter, alt: n.alt + by.semitones - natural };
}

/**
 * Transpose a key signature, explicit accidentals included, then respell the tonic when the
 * enharmonic key has fewer accidentals (the warning says so).
 * @example transposeKey(keyOf('E'), { steps: 5, semitones: 9 }).key // C# major → Db major
 */
export function transposeKey(
	key: KeySignature,
	by: Steps,
	tritone: TritoneSpelling = 'Gb',
	ties: 'keep' | 'setting' = 'keep'
): { key: KeySignature; warning: MusicWarning | null } {
	if (key.none) return { key, warning: null };
	const moved = { ...keyOf(transposeNoteName(key.tonic, by), key.mode), rest: key.rest };
	const { key: spelled, warning } = respellKey(moved, tritone, ties);
	// A respelled key moves every letter one step (G# → Ab is a diminished second, 0 semitones).
	const shift = stepsBetween(moved.tonic, spelled.tonic);
	const letterShift = shift.steps > 3 ? shift.steps - 7 : shift.steps;
	const total = addSteps(by, { steps: letterShift, semitones: 0 });
	const explicit = key.explicit.map((e) => transposeNoteName(e, total));
	const accidentals = spelled.accidentals.slice();
	for (const e of explicit) accidentals[e.letter] = e.alt;
	return { key: { ...spelled, explicit, accidentals }, warning };
}

/**
 * Spell a target key for a mode: the tonic asked for, or its enharmonic twin when that has fewer
 * accidentals (G# major → Ab major, with a warning).
 * @example targetKey({ letter: 4, alt: 1 }, 'major', 'Gb').key.tonic // Ab
 */
export function targetKey(
	tonic: SpelledNote,
	mode: KeySignature['mode'],
	tritone: TritoneSpelling = 'Gb'
): { key: KeySignature; warning: MusicWarning | null } {
	return respellKey(keyOf(tonic, mode), tritone);
}

/**
 * A twelve-key target by pitch class with the usual jazz spelling for the mode.
 * @example jazzKey(6, 'major', 'F#').tonic // F#
 */
export function jazzKey(
	pc: number,
	mode: KeySignature['mode'],
	tritone: TritoneSpelling = 'Gb'
): KeySignature {
	return keyOf(jazzTonic(pc, mode, tritone), mode);
}

/** What a transposition does to the keys of a tune: one interval, every key moved by it. */
export interface KeyPlan {
	/** From the lick's own pitch to the output's, octave shift included. */
	interval: Steps;
	/** The new key for each entry of the tune's `keys`. */
	keys: KeySignature[];
	warnings: MusicWarning[];
}

/**
 * Plan the keys of a transposition: the first key goes to `to` (or stays), later key changes
 * follow by the same interval.
 * @example planKeys([keyOf('Bb')], { letter: 0, alt: 0 }).interval // { steps: 1, semitones: 2 }
 */
export function planKeys(
	keys: readonly KeySignature[],
	to: SpelledNote | null,
	options: { tritone?: TritoneSpelling; octaves?: number } = {}
): KeyPlan {
	const tritone = options.tritone ?? 'Gb';
	const warnings: MusicWarning[] = [];
	const first = keys[0];
	let interval: Steps = UNISON;
	if (to && !first.none) {
		const target = targetKey(to, first.mode, tritone);
		if (target.warning) warnings.push(target.warning);
		interval = intervalToKey(first.tonic, target.key.tonic);
	} else if (to) {
		interval = intervalToKey({ letter: 0, alt: 0 }, to);
	}
	const octaves = options.octaves ?? 0;
	interval = addSteps(interval, { steps: 7 * octaves, semitones: 12 * octaves });
	const out: KeySignature[] = [];
	for (let i = 0; i < keys.length; i++) {
		const key = keys[i];
		// The target keeps the spelling asked for; later key changes follow the tritone setting.
		const moved = transposeKey(key, interval, tritone, i === 0 || !to ? 'keep' : 'setting');
		if (moved.warning && !warnings.some((w) => w.message === moved.warning?.message)) {
			warnings.push(moved.warning);
		}
		out.push(moved.key);
	}
	return { interval, keys: out, warnings };
}

/**
 * Move a key plan further by another interval (a transposing instrument's written offset).
 * @example shiftPlan(plan, { steps: 1, semitones: 2 }) // Bb trumpet part of a concert plan
 */
export function shiftPlan(
	keys: readonly KeySignature[],
	plan: KeyPlan,
	by: Steps,
	tritone: TritoneSpelling = 'Gb',
	ties: 'keep' | 'setting' = 'setting'
): KeyPlan {
	if (by.steps === 0 && by.semitones === 0) return plan;
	const interval = addSteps(plan.interval, by);
	const warnings: MusicWarning[] = [];
	const out = keys.map((key, i) => {
		// An octave move keeps the spelling the concert key was given (F# asked, F# written).
		const moved = transposeKey(key, interval, tritone, i === 0 ? ties : 'setting');
		if (moved.warning && !warnings.some((w) => w.message === moved.warning?.message)) {
			warnings.push(moved.warning);
		}
		return moved.key;
	});
	return { interval, keys: out, warnings };
}

/**
 * Transpose one pitch and spell it for the key in force.
 * @example transposeInKey({ letter: 6, alt: -1, octave: 4 }, { steps: 1, semitones: 2 }, keyOf('C')) // C5
 */
export function transposeInKey(p: SpelledPitch, by: Steps, key: KeySignature): SpelledPitch {
	return simplifySpelling(transposePitch(p, by), key.accidentals);
}
