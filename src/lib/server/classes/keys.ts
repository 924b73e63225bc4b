import { CYCLE_OF_FOURTHS, MAJOR_KEY_SPELLINGS } from '../../music/key-data';
import { chromaOf, mod12, parseNoteName } from '../../music/pitch';

/**
 * Keys as classes name them: a tonic spelled the usual jazz way for its pitch class (`Db`, not
 * `C#`), so that `F#` typed by a teacher and `Gb` stored by the drill count as one key.
 */

/**
 * The pitch class (0–11, C = 0) of a tonic name; null when it is not one.
 * @example pitchClassOf('F#') // 6; pitchClassOf('H') // null
 */
export function pitchClassOf(tonic: unknown): number | null {
	if (typeof tonic !== 'string' || tonic.length > 4) return null;
	const note = parseNoteName(tonic);
	if (!note) return null;
	return mod12(chromaOf(note));
}

/**
 * A tonic respelled as the key list spells it; null when it is not one.
 * @example normalizeKey('C#') // 'Db'; normalizeKey('Bb') // 'Bb'
 */
export function normalizeKey(tonic: unknown): string | null {
	const pc = pitchClassOf(tonic);
	return pc === null ? null : MAJOR_KEY_SPELLINGS[pc];
}

/**
 * The twelve keys in the order a learner drills them: around the cycle of fourths for those who
 * chose it, otherwise chromatically from C (their keys come weighted, in no fixed order).
 * @example keyColumns('fourths').slice(0, 3) // ['C', 'F', 'Bb']
 */
export function keyColumns(keyOrder: string): string[] {
	return keyOrder === 'fourths'
		? CYCLE_OF_FOURTHS.map((k) => normalizeKey(k) ?? k)
		: [...MAJOR_KEY_SPELLINGS];
}
