/**
 * Key picking: each prompt's concert key, so that every lick goes round all twelve keys over time.
 * Weighted (default): keys never played for the lick first, then those played longest ago or
 * graded worst; never the same key twice running for one lick (while there is another to pick).
 * Round the cycle of fourths: the next key after the last one played. Fixed: always one key.
 * Always within the keys an assignment names. Pure: history and seed are passed in.
 */
import { CYCLE_OF_FOURTHS, MAJOR_KEY_SPELLINGS } from '../music/key-data';
import { chromaOf, mod12, parseNoteName } from '../music/pitch';
import { pickWeighted, seededRandom } from './random';

/** The twelve concert tonics as a jazz player spells them (common practice; REFERENCES.md §2). */
export const TWELVE_KEYS = MAJOR_KEY_SPELLINGS;

/** The usual twelve-key practice order round the cycle of fourths (common practice). */
export const FOURTHS_ORDER = CYCLE_OF_FOURTHS;

export type KeyMode = 'weighted' | 'fourths' | 'fixed';

/**
 * Pitch class of a key tonic ('Eb' 3, 'F#' 6, 'Gb' 6); null for anything else.
 * @example keyPitchClass('Bb') // 10
 */
export function keyPitchClass(key: string): number | null {
	if (!/^[A-G](#|b)?$/.test(key)) return null;
	const n = parseNoteName(key);
	return n && mod12(chromaOf(n));
}

/** One prompt of a lick in the past: its key, when, how it went. */
export interface KeyPlay {
	key: string;
	at: Date;
	grade: number;
}

export interface KeyPickInput {
	mode: KeyMode;
	/** Keys allowed (an assignment's); null or empty for all twelve. */
	allowed?: readonly string[] | null;
	/** The lick's past prompts (any quality), oldest first. */
	history: readonly KeyPlay[];
	/** The key a fixed mode keeps (defaults to the first allowed key). */
	fixedKey?: string;
	/** Seeds the weighted draw (e.g. card id and repetition count). */
	seed: string;
	now: Date;
}

const DAY_MS = 86_400_000;

/** Grades looked at per key for "graded worst". */
const RECENT_GRADES = 3;

/**
 * The key for the next prompt of a lick.
 * @example pickKey({ mode: 'fourths', history: [{ key: 'C', at, grade: 3 }], seed: 's', now }) // 'F'
 */
export function pickKey(input: KeyPickInput): string {
	const allowed = allowedKeys(input.allowed);
	const last = input.history.at(-1)?.key;
	const lastPc = last === undefined ? null : keyPitchClass(last);
	if (input.mode === 'fixed') {
		const fixed =
			input.fixedKey && keyPitchClass(input.fixedKey) !== null ? input.fixedKey : allowed[0];
		return allowed.find((k) => keyPitchClass(k) === keyPitchClass(fixed)) ?? allowed[0];
	}
	if (allowed.length === 1) return allowed[0];
	if (input.mode === 'fourths') {
		if (lastPc === null) return allowed[0];
		const order = FOURTHS_ORDER.map((k) => keyPitchClass(k)!);
		const at = order.indexOf(lastPc);
		for (let i = 1; i <= 12; i++) {
			const pc = order[(at + i) % 12];
			const key = allowed.find((k) => keyPitchClass(k) === pc);
			if (key) return key;
		}
		return allowed[0];
	}
	const candidates = allowed.filter((k) => keyPitchClass(k) !== lastPc);
	const weights = candidates.map((k) => keyWeight(k, input.history, input.now));
	const i = pickWeighted(weights, seededRandom(input.seed));
	return candidates[Math.max(0, i)];
}

/**
 * How much a key is wanted: a key never played outweighs everything else together; otherwise
 * days since it was last played and how badly its recent prompts went.
 */
function keyWeight(key: string, history: readonly KeyPlay[], now: Date): number {
	const pc = keyPitchClass(key);
	const plays = history.filter((h) => keyPitchClass(h.key) === pc);
	if (plays.length === 0) return 1000;
	const lastAt = plays[plays.length - 1].at.getTime();
	const days = Math.max(0, (now.getTime() - lastAt) / DAY_MS);
	const recent = plays.slice(-RECENT_GRADES);
	const meanGrade = recent.reduce((sum, p) => sum + p.grade, 0) / recent.length;
	// Age counts up to two months; a mean grade of 1 adds as much as a month unplayed.
	return 1 + Math.min(days, 60) / 7 + (4 - meanGrade) * 1.5;
}

/** The allowed keys as names, in chromatic order; all twelve when none (or none valid) given. */
export function allowedKeys(allowed?: readonly string[] | null): string[] {
	const seen = new Set<number>();
	const out: string[] = [];
	for (const k of allowed ?? []) {
		const pc = keyPitchClass(k);
		if (pc === null || seen.has(pc)) continue;
		seen.add(pc);
		out.push(k);
	}
	return out.length ? out : [...TWELVE_KEYS];
}
