/**
 * Chord qualities as lookup tables by semitones above the root. Everything a per-note function
 * needs (label, role, spelling, degree number) is computed once here from `qualities-data.ts`,
 * so that labelling and re-mapping a note is a couple of array reads.
 */
import {
	LETTER_SEMITONES,
	formatNoteName,
	mod12,
	MusicInvariantError,
	parseNoteName,
	type Steps
} from './pitch';
import {
	BASE_LABELS,
	LABEL_NUMBER,
	QUALITY_ROWS,
	type DegreeLabel,
	type QualityRow
} from './qualities-data';
import { QUALITY_IDS, type NoteName, type QualityId } from './types';

export type { DegreeLabel, QualityRow } from './qualities-data';

/** What a pitch is to a chord: part of it, a colour it allows, a clash, or outside its scale. */
export type DegreeRole = 'chord-tone' | 'tension' | 'avoid' | 'chromatic';

/** A quality with its per-semitone tables (index = semitones above the root, 0..11). */
export interface QualityTable {
	row: QualityRow;
	labels: readonly DegreeLabel[];
	roles: readonly DegreeRole[];
	/** Chord tone, tension or avoid note: a note of the chord scale (or of its usual alternative). */
	inScale: readonly boolean[];
	/** A note of the parent scale itself (Mixolydian for 7: no b9, #9, #11 or b13). */
	inParentScale: readonly boolean[];
	/** How a note at these semitones is written when it belongs to the chord or its scale. */
	spelling: readonly Steps[];
	/** Semitones of the chord tone holding each degree number (1..7), when the chord has one. */
	chordToneByNumber: readonly (number | undefined)[];
	/** Candidate semitones for each degree number (1..7) in the parent scale, first preferred. */
	scaleByNumber: readonly (readonly number[])[];
	/** Semitones of the chord tone standing in for a degree number the chord lacks (row.standIn). */
	standInByNumber: readonly (number | undefined)[];
}

const INTERVAL = /^(-?)(\d+)(P|M|m|A+|d+)$/;
const PERFECT = [true, false, false, true, true, false, false];

/**
 * Letter steps and semitones of a tonal-style interval name.
 * @example parseInterval('6m') // { steps: 5, semitones: 8 }
 */
export function parseInterval(name: string): Steps {
	const m = INTERVAL.exec(name);
	if (!m || Number(m[2]) < 1) throw new MusicInvariantError(`Not an interval name: '${name}'`);
	const number = Number(m[2]) - 1;
	const simple = number % 7;
	const base = LETTER_SEMITONES[simple] + 12 * Math.floor(number / 7);
	const q = m[3];
	const perfect = PERFECT[simple];
	if ((q === 'P' && !perfect) || ((q === 'M' || q === 'm') && perfect))
		throw new MusicInvariantError(`Not an interval name: '${name}'`);
	let diff = 0;
	if (q === 'm') diff = -1;
	else if (q[0] === 'A') diff = q.length;
	else if (q[0] === 'd') diff = perfect ? -q.length : -q.length - 1;
	const sign = m[1] ? -1 : 1;
	return { steps: sign * number, semitones: sign * (base + diff) };
}

/** Spelling of notes outside the chord scale: flat side going down, sharp side going up. */
export const DESCENDING_SPELLING: readonly Steps[] = [
	'1P',
	'2m',
	'2M',
	'3m',
	'3M',
	'4P',
	'5d',
	'5P',
	'6m',
	'6M',
	'7m',
	'7M'
].map(parseInterval);
export const ASCENDING_SPELLING: readonly Steps[] = [
	'1P',
	'1A',
	'2M',
	'2A',
	'3M',
	'4P',
	'4A',
	'5P',
	'5A',
	'6M',
	'6A',
	'7M'
].map(parseInterval);

function buildTable(row: QualityRow): QualityTable {
	const labels = [...BASE_LABELS];
	for (const [s, label] of Object.entries(row.labels ?? {})) if (label) labels[Number(s)] = label;
	const roles: DegreeRole[] = Array(12).fill('chromatic');
	const spelling: Steps[] = [...DESCENDING_SPELLING];
	const inScale: boolean[] = Array(12).fill(false);
	// Later groups do not overwrite earlier ones: a chord tone stays a chord tone.
	const groups: [readonly string[], DegreeRole][] = [
		[row.chordTones, 'chord-tone'],
		[row.tensions, 'tension'],
		[row.avoid, 'avoid']
	];
	const assigned: boolean[] = Array(12).fill(false);
	for (const [intervals, role] of groups) {
		for (const name of intervals) {
			const iv = parseInterval(name);
			const s = mod12(iv.semitones);
			if (assigned[s]) continue;
			assigned[s] = true;
			roles[s] = role;
			inScale[s] = true;
			spelling[s] = iv;
		}
	}
	const inParentScale: boolean[] = Array(12).fill(false);
	for (const name of row.scale.intervals) {
		const s = mod12(parseInterval(name).semitones);
		inParentScale[s] = true;
		if (!inScale[s])
			throw new MusicInvariantError(`Scale tone ${name} of ${row.id} has no role in the table`);
	}
	for (const [s, name] of Object.entries(row.spelling ?? {}))
		if (name) spelling[Number(s)] = parseInterval(name);

	const chordToneByNumber: (number | undefined)[] = Array(8).fill(undefined);
	for (const name of row.chordTones) {
		const s = mod12(parseInterval(name).semitones);
		chordToneByNumber[LABEL_NUMBER[labels[s]]] = s;
	}
	const scaleByNumber: number[][] = Array.from({ length: 8 }, () => []);
	for (const name of row.scale.intervals) {
		const iv = parseInterval(name);
		scaleByNumber[iv.steps + 1].push(mod12(iv.semitones));
	}
	for (const [n, names] of Object.entries(row.choices ?? {}))
		scaleByNumber[Number(n)] = (names ?? []).map((name) => mod12(parseInterval(name).semitones));
	const standInByNumber: (number | undefined)[] = Array(8).fill(undefined);
	for (const [n, name] of Object.entries(row.standIn ?? {}))
		if (name) standInByNumber[Number(n)] = mod12(parseInterval(name).semitones);
	return {
		row,
		labels,
		roles,
		inScale,
		inParentScale,
		spelling,
		chordToneByNumber,
		scaleByNumber,
		standInByNumber
	};
}

const TABLES = new Map<QualityId, QualityTable>(QUALITY_ROWS.map((r) => [r.id, buildTable(r)]));

/**
 * Whether a string is one of the qualities the engine knows.
 * @example isQualityId('m7b5') // true
 */
export function isQualityId(value: unknown): value is QualityId {
	return typeof value === 'string' && (QUALITY_IDS as readonly string[]).includes(value);
}

/**
 * The precomputed table of a quality; an unknown id is a caller's bug and throws.
 * @example qualityTable('m7').labels[3] // 'b3'
 */
export function qualityTable(id: QualityId): QualityTable {
	const table = TABLES.get(id);
	if (!table) throw new MusicInvariantError(`Unknown chord quality '${id}'`);
	return table;
}

function spellAbove(root: NoteName, intervals: readonly string[]): NoteName[] {
	const r = parseNoteName(root);
	if (!r) throw new MusicInvariantError(`Not a note name: '${root}'`);
	return intervals.map((name) => {
		const iv = parseInterval(name);
		const letter = (r.letter + iv.steps) % 7;
		const natural = LETTER_SEMITONES[letter] - LETTER_SEMITONES[r.letter];
		let alt = r.alt + iv.semitones - natural;
		while (alt > 6) alt -= 12;
		while (alt < -6) alt += 12;
		return formatNoteName({ letter, alt });
	});
}

/**
 * Chord tones of a quality over a root, spelled by interval.
 * @example chordTones('m7b5', 'B') // ['B', 'D', 'F', 'A']
 */
export function chordTones(id: QualityId, root: NoteName): NoteName[] {
	return spellAbove(root, qualityTable(id).row.chordTones);
}

/** A quality's parent chord scale over a root, for the teacher's screen. */
export interface ChordScale {
	name: string;
	notes: NoteName[];
	intervals: readonly string[];
	semitones: number[];
	degrees: DegreeLabel[];
	tensions: DegreeLabel[];
	avoid: DegreeLabel[];
}

/**
 * The parent chord scale of a quality over a root, with degree names, tensions and avoid notes.
 * @example chordScale('7', 'G').notes // ['G', 'A', 'B', 'C', 'D', 'E', 'F']
 */
export function chordScale(id: QualityId, root: NoteName): ChordScale {
	const t = qualityTable(id);
	const semis = (names: readonly string[]) => names.map((n) => mod12(parseInterval(n).semitones));
	const semitones = semis(t.row.scale.intervals);
	return {
		name: t.row.scale.name,
		notes: spellAbove(root, t.row.scale.intervals),
		intervals: t.row.scale.intervals,
		semitones,
		degrees: semitones.map((s) => t.labels[s]),
		tensions: semis(t.row.tensions).map((s) => t.labels[s]),
		avoid: semis(t.row.avoid).map((s) => t.labels[s])
	};
}
