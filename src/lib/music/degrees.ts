/**
 * Degree labels: what a note is over the chord in force, named by its semitones above the root
 * (over E7, G is the #9 although its letter makes a minor third).
 *
 * Decisions (common practice, documented here because books differ):
 * - 3 semitones is b3 on the minor-third chords (m7, m6, m7b5, dim7) and #9 elsewhere.
 * - 6 semitones is b5 on those same chords (on m7 and m6 it is the blue note, outside the scale)
 *   and #11 elsewhere.
 * - 9 semitones is bb7 on dim7 (the chord's own seventh), 6 on the sixth chords, else 13.
 * - 4 semitones over a minor chord keeps the name 3 with the role 'chromatic'.
 * - A chord whose quality is unknown still gets names (as over a dominant) with role 'unknown'.
 */
import {
	chromaOf,
	mod12,
	MusicInvariantError,
	parseNoteName,
	parsePitchName,
	type SpelledNote
} from './pitch';
import { chordShape, type ChordShape } from './chord-shape';
import { BASE_LABELS, LABEL_NUMBER } from './qualities-data';
import { qualityTable, type DegreeLabel, type DegreeRole } from './qualities';
import {
	QUALITY_IDS,
	type ChordContext,
	type NoteName,
	type PitchName,
	type QualityId
} from './types';

export type { DegreeLabel, DegreeRole } from './qualities';

/** A note's degree over a chord. Objects are shared and frozen: do not mutate. */
export interface Degree {
	label: DegreeLabel;
	/** Semitones above the chord root, 0..11. */
	semitones: number;
	/** Scale-degree number 1..7 the label belongs to (b9 and #9 are both 2). */
	number: number;
	role: DegreeRole | 'unknown';
}

function makeDegrees(quality: QualityId | null): readonly Degree[] {
	return Array.from({ length: 12 }, (_, s) => {
		const table = quality ? qualityTable(quality) : null;
		const label = table ? table.labels[s] : BASE_LABELS[s];
		return Object.freeze({
			label,
			semitones: s,
			number: LABEL_NUMBER[label],
			role: table ? table.roles[s] : ('unknown' as const)
		});
	});
}

const DEGREES = new Map<QualityId | null, readonly Degree[]>([
	...QUALITY_IDS.map((q) => [q, makeDegrees(q)] as const),
	[null, makeDegrees(null)]
]);

const noteCache = new Map<string, SpelledNote>();

/**
 * A note or pitch name read once and remembered (the hot path meets the same few names).
 * Throws on a name that is neither: callers pass names the engine produced.
 * @example readNote('F#4') // { letter: 3, alt: 1 }
 */
export function readNote(name: NoteName | PitchName): SpelledNote {
	let n = noteCache.get(name);
	if (n) return n;
	const parsed = parseNoteName(name) ?? parsePitchName(name);
	if (!parsed) throw new MusicInvariantError(`Not a note or pitch name: '${name}'`);
	n = { letter: parsed.letter, alt: parsed.alt };
	noteCache.set(name, n);
	return n;
}

/**
 * Pitch class (0..11) of a note or pitch name.
 * @example chromaOfName('Bb3') // 10
 */
export function chromaOfName(name: NoteName | PitchName): number {
	const n = readNote(name);
	return mod12(chromaOf(n));
}

/**
 * The degree at a number of semitones above the root of a chord of the given quality.
 * @example degreeAt(3, 'm7').label // 'b3'
 */
export function degreeAt(semitones: number, quality: QualityId | null): Degree {
	const row = DEGREES.get(quality);
	if (!row) throw new MusicInvariantError(`Unknown chord quality '${quality}'`);
	return row[mod12(semitones)];
}

/** Degrees read from a chord symbol's own tones, by shape (a lick holds a handful of shapes). */
const shapeDegrees = new WeakMap<ChordShape, Map<QualityId | null, readonly Degree[]>>();

/**
 * The twelve degrees over a chord symbol, by semitones above its root: from the symbol's own
 * chord tones first (over CmMaj7, 3 semitones is the b3; over C7#9, 7 is the 5, a chord tone),
 * then from the quality it reduces to. Built once per shape and quality.
 * @example degreesOfShape(chordShape(chordOf('CmMaj7')), null)[3].label // 'b3'
 */
export function degreesOfShape(shape: ChordShape, quality: QualityId | null): readonly Degree[] {
	let byQuality = shapeDegrees.get(shape);
	if (!byQuality) {
		byQuality = new Map();
		shapeDegrees.set(shape, byQuality);
	}
	let row = byQuality.get(quality);
	if (!row) {
		row = Array.from({ length: 12 }, (_, s) => {
			const label = shape.labels[s];
			const role = shape.roles[s];
			return label && role
				? Object.freeze({ label, semitones: s, number: LABEL_NUMBER[label], role })
				: degreeAt(s, quality);
		});
		byQuality.set(quality, row);
	}
	return row;
}

/**
 * The degree rows of a lick's chord symbols (null where a symbol names no chord), read once per
 * quality layer: moving a layer to another key keeps every symbol's quality and shape.
 * @example degreeRows([chordShape(chordOf('C7'))], [chordOf('C7')])[0]?.[4].label // '3'
 */
export function degreeRows(
	shapes: readonly (ChordShape | null)[],
	contexts: readonly (ChordContext | null)[]
): (readonly Degree[] | null)[] {
	const rows: (readonly Degree[] | null)[] = new Array(shapes.length);
	for (let i = 0; i < shapes.length; i++) {
		const shape = shapes[i];
		rows[i] = shape && degreesOfShape(shape, contexts[i]?.quality ?? null);
	}
	return rows;
}

/**
 * The degree at some semitones above the root of a chord symbol (see `degreesOfShape`).
 * @example degreeInShape(chordShape(chordOf('C7#9')), 7, '7alt').label // '5'
 */
export function degreeInShape(
	shape: ChordShape,
	semitones: number,
	quality: QualityId | null
): Degree {
	return degreesOfShape(shape, quality)[mod12(semitones)];
}

/**
 * Degree of a pitch over a chord, by semitones in context, read from the chord symbol's own
 * tones and its quality's scale.
 * @example degreeOf('G4', { symbol: 'E7', root: 'E', quality: '7', bass: null }) // #9, tension
 */
export function degreeOf(pitch: NoteName | PitchName, chord: ChordContext): Degree {
	return degreeInShape(
		chordShape(chord),
		chromaOfName(pitch) - chromaOfName(chord.root),
		chord.quality
	);
}
