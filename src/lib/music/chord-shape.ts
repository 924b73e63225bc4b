/**
 * What each of the twelve pitch classes is over one chord symbol: its degree label, its role and
 * the letter it is written on. Two sources, the symbol's own chord tones first:
 * - the tones the symbol itself names (`C7#9` names a 5 and a #9, `CmMaj7` a b3 and a 7), read
 *   from tonal 6.5.1's chord-type dictionary (`ChordType.get(suffix).intervals`), so that a
 *   quality outside our table is labelled from its own tones rather than from a neighbour's;
 * - the quality table (`qualities-data.ts`) for the rest of the chord scale: tensions and avoid
 *   notes with their usual spelling.
 * A chord tone or tension is written on the letter its interval gives above the root (the third
 * two letters up, and so on; common practice), whatever the key signature.
 */
import { chordToneIntervals, isPlainChordSuffix, parseChordSymbol } from './chord-symbol';
import { mod12 } from './pitch';
import { parseInterval, qualityTable, type DegreeLabel, type DegreeRole } from './qualities';
import type { Steps } from './pitch';
import type { ChordContext, QualityId } from './types';

/** A chord symbol's view of the twelve pitch classes, by semitones above its root. */
export interface ChordShape {
	/** Interval to write each pitch class on, or null where the chord has no say (chromatic). */
	spelling: readonly (Steps | null)[];
	labels: readonly (DegreeLabel | null)[];
	roles: readonly (DegreeRole | null)[];
}

/**
 * Degree label of an interval above a chord root; `sixth` names 9 semitones 6 rather than 13,
 * `sus` a perfect fourth 4 rather than 11 (it stands in for the third).
 * @example intervalLabel(parseInterval('9A'), false) // '#9'
 */
export function intervalLabel(iv: Steps, sixth: boolean, sus = false): DegreeLabel {
	const n = ((iv.steps % 7) + 7) % 7;
	const s = mod12(iv.semitones);
	switch (n) {
		case 0:
			return 'R';
		case 1:
			return s === 1 ? 'b9' : s === 3 ? '#9' : '9';
		case 2:
			return s === 3 ? 'b3' : '3';
		case 3:
			return s === 6 ? '#11' : sus && s === 5 ? '4' : '11';
		case 4:
			return s === 6 ? 'b5' : s === 8 ? 'b13' : '5';
		case 5:
			return s === 8 ? 'b13' : sixth ? '6' : '13';
		default:
			return s === 9 ? 'bb7' : s === 10 ? 'b7' : '7';
	}
}

const shapes = new Map<string, ChordShape>();

/**
 * The shape of a chord in force (cached by symbol; a lick holds a handful).
 * @example chordShape({ symbol: 'CmMaj7', root: 'C', quality: null, bass: null }).labels[3] // 'b3'
 */
export function chordShape(chord: ChordContext): ChordShape {
	const key = chord.symbol + '|' + (chord.quality ?? '');
	let shape = shapes.get(key);
	if (shape) return shape;
	shape = buildShape(parseChordSymbol(chord.symbol)?.suffix ?? '', chord.quality);
	if (shapes.size > 2000) shapes.clear();
	shapes.set(key, shape);
	return shape;
}

function buildShape(suffix: string, quality: QualityId | null): ChordShape {
	const spelling: (Steps | null)[] = Array(12).fill(null);
	const labels: (DegreeLabel | null)[] = Array(12).fill(null);
	const roles: (DegreeRole | null)[] = Array(12).fill(null);
	if (!isPlainChordSuffix(suffix)) {
		// tonal's dictionary knows `7#9`, `mMaj7`, `13`, `7b13`…; an unknown type adds nothing.
		const own = chordToneIntervals(suffix);
		const sixth = own.some((i) => i === '6M' || i === '6m');
		const sus = suffix.includes('sus');
		for (const name of own) {
			const iv = parseInterval(name);
			const s = mod12(iv.semitones);
			spelling[s] = iv;
			labels[s] = intervalLabel(iv, sixth, sus);
			roles[s] = 'chord-tone';
		}
	}
	if (quality) {
		const t = qualityTable(quality);
		for (let s = 0; s < 12; s++) {
			if (roles[s] !== null || t.roles[s] === 'chromatic') continue;
			spelling[s] = t.spelling[s];
			labels[s] = t.labels[s];
			roles[s] = t.roles[s];
		}
	}
	return { spelling, labels, roles };
}
