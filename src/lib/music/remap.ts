/**
 * Chord-quality re-mapping: a line written over one quality, re-sounded over another quality of
 * the same root, through chord-scale degrees (common practice; see REFERENCES.md §3).
 *
 * Per note, in this order:
 * 1. A pitch that is a chord tone of the target stays (the #9 of D7 is the b3 of Dm7).
 * 2. A chord tone of the source moves to the target's chord tone of the same number (3 → b3,
 *    5 → b5, b7 → 7).
 * 3. A pitch that is an available tension of the target stays (#11 over maj7).
 * 4. Otherwise the degree number is kept and its alteration taken from the target's scale
 *    (b13 → 13 over Dorian). Where the target scale holds that number twice or not at all
 *    (the altered scale), the nearest candidate wins, a tie goes the way the line moves, and a
 *    warning says the choice was a judgement call.
 * 5. A colour note whose new pitch collides with a neighbour takes its second home when that
 *    does not collide (13 → bb7 on dim7 next to b7 → bb7 becomes b13); a chord tone that landed
 *    on a chord tone never moves aside.
 * Approach and passing tones are not mapped by degree: a chromatic run between two chord tones
 * is re-derived backwards from its target, a half step at a time (a 3 → R fill on D7 becomes
 * F F E Eb D on Dm7: the fill now spans a minor third, one passing tone too many, and a warning
 * says so). A single note outside the parent scale (an altered tension such as b9 or b13, or a
 * chromatic note) a half step off the next note, or enclosing the note after next, becomes the
 * same approach (same side, same distance) to that note after it moved. Targets are chord tones
 * or parent-scale notes (an enclosure of the 9 keeps its shape). Steps of the parent scale itself
 * (11 → 3 on a dominant) stay melody: they are mapped by degree, so F E over C7 is F Eb on Cm7.
 *
 * Which chord a note is mapped over: the chord in force (`note.chord`) when it has the home root
 * or the source quality, else the note is left as written (the other chords of a progression
 * are not the chord being re-mapped); notes before any chord use `options.root`.
 */
import {
	formatNoteName,
	formatPitch,
	LETTER_SEMITONES,
	mod12,
	MusicInvariantError,
	type SpelledNote,
	type Steps
} from './pitch';
import { chromaOfName, readNote } from './degrees';
import { LABEL_NUMBER } from './qualities-data';
import {
	ASCENDING_SPELLING,
	DESCENDING_SPELLING,
	qualityTable,
	type QualityTable
} from './qualities';
import { chordMark, outputMark, plainText, sourceMark } from './speech';
import { QUALITY_IDS } from './types';
import type { MusicWarning, NoteName, PitchName, QualityId, SoundingNote } from './types';

export interface RemapOptions {
	from: QualityId;
	to: QualityId;
	/** Root of the home chord; defaults to the root of the first chord in force. */
	root?: NoteName;
}

export interface RemapResult {
	/** One spelled pitch per input note, in the same order. */
	pitches: PitchName[];
	warnings: MusicWarning[];
}

/** The smallest move between two semitone offsets, in -5..6. */
const smallestMove = (from: number, to: number): number => {
	const d = mod12(to - from);
	return d > 6 ? d - 12 : d;
};

/** How one source semitone moves onto a target quality. */
interface Move {
	/** Target semitones, preferred first; more than one means a judgement call. */
	candidates: number[];
	/** Why the move is ambiguous, when the target's table names a reason. */
	reason: string | null;
	/** Where the note goes instead when the first choice collides with a neighbour. */
	alternative: number | null;
	/** A chord tone that lands on the target's chord tone of its own number: it never moves aside. */
	anchored: boolean;
	/** A chord tone that lands on the chord tone standing in for its number (the 3 on the 4 of a sus). */
	standIn: boolean;
}

function byNumber(T: QualityTable, s: number, number: number): number[] {
	let candidates = [...T.scaleByNumber[number]];
	if (candidates.length === 0) {
		// No such degree in the target scale: its nearest notes, both sides when they tie.
		for (let d = 1; d <= 6 && candidates.length === 0; d++)
			candidates = [s + d, s - d].map(mod12).filter((c) => T.inScale[c]);
	}
	return candidates.sort((a, b) => Math.abs(smallestMove(s, a)) - Math.abs(smallestMove(s, b)));
}

function planMove(F: QualityTable, T: QualityTable, s: number): Move {
	const label = F.labels[s];
	const number = LABEL_NUMBER[label];
	const reason = T.row.ambiguous?.[label] ?? null;
	const scale = byNumber(T, s, number);
	const source = F.roles[s] === 'chord-tone';
	const kept = (t: number, standIn = false): Move => ({
		candidates: [t],
		reason: null,
		alternative: scale[0] !== t ? scale[0] : null,
		anchored: source && T.roles[t] === 'chord-tone' && !standIn,
		standIn
	});
	if (T.roles[s] === 'chord-tone') return kept(s);
	const tone = T.chordToneByNumber[number];
	if (source && tone !== undefined) return kept(tone);
	// A chord tone the target lacks lands on the one standing in for it (b7 → 6, 3 → 4); when
	// that meets a neighbour it keeps its scale degree instead (G A Bb C over C6 is G A B C).
	const standIn = T.standInByNumber[number];
	if (source && standIn !== undefined) return kept(standIn, true);
	if (T.roles[s] === 'tension') return kept(s);
	return {
		candidates: scale,
		reason: scale.length > 1 ? null : reason,
		alternative: scale.length > 1 ? scale[1] : null,
		anchored: false,
		standIn: false
	};
}

/** Moves for every (from, to, semitones), computed once. */
const MOVES = new Map<string, Move[]>();
for (const from of QUALITY_IDS)
	for (const to of QUALITY_IDS) {
		const F = qualityTable(from);
		const T = qualityTable(to);
		MOVES.set(
			from + '>' + to,
			Array.from({ length: 12 }, (_, s) => planMove(F, T, s))
		);
	}

// Imported tables read once into module constants: the hot loop then reads plain arrays.
const LS: readonly number[] = [...LETTER_SEMITONES];
const DESC: readonly Steps[] = [...DESCENDING_SPELLING];
const ASC: readonly Steps[] = [...ASCENDING_SPELLING];
/** Spell a pitch at `midi` as an interval above a root, without double accidentals. */
function spell(root: SpelledNote, iv: Steps, midi: number): PitchName {
	let letter = (root.letter + iv.steps) % 7;
	const pc = mod12(LS[root.letter] + root.alt + iv.semitones);
	let alt = smallestMove(LS[letter], pc);
	while (alt >= 2 || alt <= -2) {
		// Bbb over a Cdim7-style spelling reads as A: step to the neighbour letter.
		letter = (letter + (alt > 0 ? 1 : 6)) % 7;
		alt = smallestMove(LS[letter], pc);
	}
	const octave = Math.floor((midi - LS[letter] - alt) / 12) - 1;
	return formatPitch({ letter, alt, octave });
}

function symbolOf(root: SpelledNote, quality: QualityId): string {
	return chordMark(formatNoteName(root) + quality);
}

/** Marked names for warning templates: the source pitch of note i, its re-mapped pitch. */
const src = (job: Job, i: number): string => sourceMark(job.notes[i].index, job.notes[i].pitch);
const out = (job: Job, i: number): string => outputMark(job.notes[i].index, job.pitches[i]);

/** A warning from a marked template: plain message for the lick as written, template for variants. */
function marked(code: string, template: string, notes: number[]): MusicWarning {
	return { code, message: plainText(template), template, notes };
}

const INTERVAL_NAMES = ['unison', 'half step', 'whole step', 'minor third', 'major third'];

/** The state of one re-mapping, passed to the helpers below (no closures in the hot path). */
interface Job {
	notes: readonly SoundingNote[];
	from: QualityId;
	to: QualityId;
	F: QualityTable;
	T: QualityTable;
	moves: readonly Move[];
	/** Root of each note's chord, or null when the note stays as written. */
	roots: (SpelledNote | null)[];
	semis: Int8Array;
	/** 1 where the note is a chord tone of the source. */
	isTone: Uint8Array;
	midis: Int16Array;
	pitches: PitchName[];
	/** 1 where the note has its new pitch. */
	done: Uint8Array;
	/** Second home (semitones) of each note mapped by degree, or -1. */
	alternative: Int8Array;
	/** Note each approach tone leads to, or -1. */
	targets: Int16Array;
	/** First note of each ambiguous source label, and all its notes. */
	ambiguous: Map<string, number[]> | null;
	avoid: number[] | null;
	warnings: MusicWarning[];
}

/** Fresh working arrays for one re-mapping (nothing is shared between calls). */
function newJob(
	notes: readonly SoundingNote[],
	from: QualityId,
	to: QualityId,
	moves: readonly Move[]
): Job {
	const n = notes.length;
	return {
		notes,
		from,
		to,
		F: qualityTable(from),
		T: qualityTable(to),
		moves,
		roots: new Array(n).fill(null),
		semis: new Int8Array(n),
		isTone: new Uint8Array(n),
		midis: new Int16Array(n),
		pitches: new Array<PitchName>(n),
		done: new Uint8Array(n),
		alternative: new Int8Array(n).fill(-1),
		targets: new Int16Array(n).fill(-1),
		ambiguous: null,
		avoid: null,
		warnings: []
	};
}

function place(job: Job, i: number, midi: number, iv: Steps): void {
	job.midis[i] = midi;
	const note = job.notes[i];
	// A note that keeps its pitch and is no chord tone or tension of the target keeps the
	// teacher's spelling (the blue E♭ over C7 stays E♭ over C6, not D♯).
	const role = job.T.roles[job.semis[i]];
	job.pitches[i] =
		midi === note.midi && role !== 'chord-tone' && role !== 'tension'
			? note.pitch
			: spell(job.roots[i]!, iv, midi);
	job.done[i] = 1;
}

function byDegree(job: Job, i: number): void {
	const { notes, semis, F, T } = job;
	const s = semis[i];
	const move = job.moves[s];
	const candidates = move.candidates;
	let t = candidates[0];
	if (candidates.length > 1) {
		const a = candidates[0];
		const b = candidates[1];
		const da = smallestMove(s, a);
		const db = smallestMove(s, b);
		// A tie between two homes goes the way the line moves next.
		if (Math.abs(da) === Math.abs(db) && i + 1 < notes.length) {
			const up = notes[i + 1].midi > notes[i].midi;
			t = (up ? da > db : da < db) ? a : b;
		}
	}
	place(job, i, notes[i].midi + smallestMove(s, t), T.spelling[t]);
	const other = move.alternative === t ? candidates[0] : move.alternative;
	// A chord tone that landed on its own chord tone keeps it; anything else may move aside.
	const anchored =
		move.anchored || (F.roles[s] === 'chord-tone' && T.roles[t] === 'chord-tone' && !move.standIn);
	if (other !== null && other !== t && !anchored) job.alternative[i] = other;
	if (candidates.length > 1 || (move.reason && t !== s)) {
		job.ambiguous ??= new Map();
		const label = F.labels[s];
		const list = job.ambiguous.get(label);
		if (list) list.push(i);
		else job.ambiguous.set(label, [i]);
	}
	if (T.roles[t] === 'avoid' && F.roles[s] !== 'avoid' && notes[i].duration >= 0.25)
		(job.avoid ??= []).push(i);
}

/** Chromatic runs between two chord tones, re-derived backwards from the second. */
function mapRuns(job: Job): void {
	const { notes, roots, isTone, midis } = job;
	const n = notes.length;
	for (let a = 0; a < n - 1; a++) {
		if (!roots[a] || !isTone[a]) continue;
		const d = notes[a + 1].midi - notes[a].midi;
		if (d !== 1 && d !== -1) continue;
		let b = a + 1;
		while (b < n && roots[b] && !isTone[b] && notes[b].midi - notes[b - 1].midi === d) b++;
		if (b >= n || b === a + 1 || !roots[b] || !isTone[b] || notes[b].midi - notes[b - 1].midi !== d)
			continue;
		const gap = midis[b] - midis[a];
		const span = Math.abs(gap);
		const dir = gap === 0 ? d : Math.sign(gap);
		const table = dir < 0 ? DESC : ASC;
		for (let k = a + 1; k < b; k++) {
			const midi = midis[b] - dir * Math.min(b - k, span);
			const root = roots[k]!;
			place(job, k, midi, table[mod12(midi - LS[root.letter] - root.alt)]);
		}
		// The run hangs on its two ends now: they may not move aside later.
		job.alternative[a] = -1;
		job.alternative[b] = -1;
		if (b - a - 1 !== Math.max(span - 1, 0)) job.warnings.push(fillWarning(job, a, b, span));
		a = b - 1;
	}
}

function fillWarning(job: Job, a: number, b: number, span: number): MusicWarning {
	const { notes, roots, semis, F, T } = job;
	const d = Math.sign(notes[b].midi - notes[a].midi);
	const passing = b - a - 1;
	const room = Math.max(span - 1, 0);
	const source = Math.abs(notes[b].midi - notes[a].midi);
	const fromChord = symbolOf(roots[a]!, job.from);
	const toChord = symbolOf(roots[a]!, job.to);
	const ends = `the ${F.labels[semis[a]]} (${src(job, a)}) ${d < 0 ? 'down' : 'up'} to the ${F.labels[semis[b]]} (${src(job, b)})`;
	const now = `${INTERVAL_NAMES[span] ?? `${span} semitones`} (${out(job, a)} to ${out(job, b)})`;
	const matching = matchingSpans(T, source, d)
		.map(([x, y]) => `${T.labels[x]} → ${T.labels[y]}`)
		.join(', ');
	const hint = matching
		? ` Moving the figure to the ${INTERVAL_NAMES[source] ?? 'same span'} ${matching} of ${toChord} keeps it whole; or write this version by hand.`
		: ' Write this version by hand if it matters.';
	const notesConcerned = range(notes, a, b);
	// An end the target lacks (the 3 of a sus chord): the fill has nothing to land on.
	const lost = [a, b].find((k) => job.moves[semis[k]].standIn);
	if (lost !== undefined)
		return marked(
			'fill-lost',
			`The chromatic fill from ${ends} over ${fromChord} cannot survive over ${toChord}: it has no ${F.labels[semis[lost]]}, and the ${T.labels[landedAt(job, lost)]} (${out(job, lost)}) that takes its place leaves the fill ${passing > room ? `${passing - room === 1 ? 'one passing tone' : `${passing - room} passing tones`} too long, so a pitch repeats` : `${room - passing === 1 ? 'a half step' : `${room - passing} half steps`} short`}. Write this version by hand, or re-map over a chord that keeps the ${F.labels[semis[lost]]}.`,
			notesConcerned
		);
	if (passing > room)
		return marked(
			'fill-too-long',
			`The chromatic fill from ${ends} over ${fromChord} spans a ${INTERVAL_NAMES[source] ?? `${source} semitones`}; over ${toChord} the same chord tones are a ${now} apart, so ${passing - room === 1 ? 'one passing tone is' : `${passing - room} passing tones are`} too many and a pitch repeats.${hint}`,
			notesConcerned
		);
	return marked(
		'fill-gap',
		`The chromatic fill from ${ends} over ${fromChord} becomes a ${now} over ${toChord}: there is room for ${room - passing === 1 ? 'one more passing tone' : `${room - passing} more passing tones`}, so the line now skips a half step.${hint}`,
		notesConcerned
	);
}

function collides(job: Job, i: number, midi: number, j: number): boolean {
	return (
		j >= 0 &&
		j < job.notes.length &&
		job.midis[j] === midi &&
		job.notes[j].midi !== job.notes[i].midi
	);
}

/** Where note i went, as semitones above its root in the target. */
const landedAt = (job: Job, i: number): number =>
	mod12(job.semis[i] + job.midis[i] - job.notes[i].midi);

function finalWarnings(job: Job, kept: number[], homeName: NoteName): void {
	const { notes, roots, midis, T, warnings } = job;
	const n = notes.length;
	for (const [label, list] of job.ambiguous ?? []) {
		const i = list[0];
		const s = job.semis[i];
		const t = landedAt(job, i);
		const move = job.moves[s];
		const others = move.candidates
			.filter((c) => c !== t)
			.map((c) => `the ${T.labels[c]}`)
			.join(' or ');
		warnings.push(
			marked(
				'ambiguous',
				`The ${label} of ${symbolOf(roots[i]!, job.from)} has no single place over ` +
					`${symbolOf(roots[i]!, job.to)}: written as the ${T.labels[t]} (${out(job, i)}); ` +
					(move.candidates.length > 1 ? `${others} would also do` : (move.reason ?? '')) +
					'.',
				list.map((k) => notes[k].index)
			)
		);
	}
	const avoid = job.avoid;
	if (avoid)
		warnings.push(
			marked(
				'avoid-note',
				`${avoid.map((i) => `${out(job, i)} (the ${T.labels[landedAt(job, i)]})`).join(', ')} ${avoid.length === 1 ? 'is an avoid note' : 'are avoid notes'} over ${symbolOf(roots[avoid[0]]!, job.to)} and ${avoid.length === 1 ? 'lasts' : 'last'} a quarter note or more.`,
				avoid.map((i) => notes[i].index)
			)
		);
	for (let i = 0; i + 1 < n; i++) {
		if (midis[i] === midis[i + 1] && notes[i].midi !== notes[i + 1].midi) {
			const root = roots[i] ?? readNote(homeName);
			warnings.push(
				marked(
					'collision',
					`Two notes that differ over ${symbolOf(root, job.from)} (${src(job, i)}, ${src(job, i + 1)}) become the same pitch ${out(job, i)} over ${symbolOf(root, job.to)}.`,
					[notes[i].index, notes[i + 1].index]
				)
			);
		}
	}
	if (kept.length)
		warnings.push(
			marked(
				'other-chord-kept',
				`${kept.length === 1 ? 'One note sounds' : `${kept.length} notes sound`} over another chord of the progression (${[...new Set(kept.map((i) => chordMark(notes[i].chord!.symbol)))].join(', ')}) and ${kept.length === 1 ? 'is' : 'are'} left as written.`,
				kept.map((i) => notes[i].index)
			)
		);
}

/**
 * Re-map a line from one chord quality to another over the same root.
 * @example remapNotes(notesOf('F#4 F4 E4 Eb4 D4', 'D7'), { from: '7', to: 'm7' }).pitches // F4 F4 E4 Eb4 D4
 */
export function remapNotes(notes: readonly SoundingNote[], options: RemapOptions): RemapResult {
	const { from, to } = options;
	const moves = MOVES.get(from + '>' + to);
	if (!moves) throw new MusicInvariantError(`Cannot re-map from '${from}' to '${to}'`);
	const n = notes.length;
	if (from === to || n === 0) return { pitches: notes.map(pitchOf), warnings: [] };
	let homeName = options.root;
	for (let i = 0; homeName === undefined && i < n; i++) homeName = notes[i].chord?.root;
	if (homeName === undefined)
		throw new MusicInvariantError(
			'remapNotes needs options.root when no note has a chord in force'
		);
	const homeChroma = chromaOfName(homeName);
	const job = newJob(notes, from, to, moves);
	const { roots, semis, isTone, midis, pitches, done, F } = job;

	// Context of each note; consecutive notes share a chord object, so it is read once.
	const kept: number[] = [];
	let lastChord: SoundingNote['chord'] | undefined = undefined;
	let lastRoot: SpelledNote | null = null;
	for (let i = 0; i < n; i++) {
		const chord = notes[i].chord;
		if (chord !== lastChord) {
			lastChord = chord;
			lastRoot =
				chord && chord.quality !== from && chromaOfName(chord.root) !== homeChroma
					? null
					: readNote(chord ? chord.root : homeName);
		}
		const root = lastRoot;
		roots[i] = root;
		if (!root) {
			kept.push(i);
			midis[i] = notes[i].midi;
			pitches[i] = notes[i].pitch;
			done[i] = 1;
			continue;
		}
		const s = mod12(notes[i].midi - LS[root.letter] - root.alt);
		semis[i] = s;
		isTone[i] = F.roles[s] === 'chord-tone' ? 1 : 0;
	}

	// 1. Chord tones first: every approach is derived from where they land.
	for (let i = 0; i < n; i++) if (roots[i] && isTone[i]) byDegree(job, i);
	// 2. Chromatic runs between chord tones.
	mapRuns(job);
	// 3. Everything else by degree, then single approach tones from where their targets went.
	const targets = job.targets;
	for (let i = 0; i < n; i++) {
		if (done[i]) continue;
		targets[i] = approachTarget(job, i);
		if (targets[i] < 0) byDegree(job, i);
	}
	for (let i = 0; i < n; i++) {
		const target = targets[i];
		if (target < 0) continue;
		job.alternative[target] = -1;
		const offset = notes[i].midi - notes[target].midi;
		const midi = midis[target] + offset;
		const root = roots[i]!;
		place(job, i, midi, (offset > 0 ? DESC : ASC)[mod12(midi - LS[root.letter] - root.alt)]);
	}
	// 4. A note with a second home takes it when its first one collides with a neighbour and the
	// second does not (13 → bb7 on dim7 would meet the b7 → bb7 next to it: it becomes b13).
	for (let i = 0; i < n; i++) {
		const other = job.alternative[i];
		if (other < 0 || !(collides(job, i, midis[i], i - 1) || collides(job, i, midis[i], i + 1)))
			continue;
		const midi = notes[i].midi + smallestMove(semis[i], other);
		if (collides(job, i, midi, i - 1) || collides(job, i, midi, i + 1)) continue;
		place(job, i, midi, job.T.spelling[other]);
	}
	leanOneWay(job);
	finalWarnings(job, kept, homeName);
	return { pitches, warnings: job.warnings };
}

/**
 * Which way a spelling leans from its root: -1 for a minor or diminished interval (D♭, G♭ over
 * C), +1 for an augmented one (D♯, F♯ over C), 0 for major and perfect ones.
 */
function leanOf(root: SpelledNote, pitch: PitchName): number {
	const p = readNote(pitch);
	const steps = (p.letter - root.letter + 7) % 7;
	const diff = smallestMove(LS[steps], mod12(LS[p.letter] + p.alt - LS[root.letter] - root.alt));
	return Math.sign(diff);
}

/**
 * One gesture (notes without a rest between them, over the chord being re-mapped) does not mix
 * a G♭ with a D♯: the chromatic notes the re-mapping moved are written on the side the gesture
 * leans. The target's tensions decide first (their spelling is the chord's: the #11 of C7alt is
 * G♭), then the teacher's own spelling of the gesture, then flats (common practice: horn charts
 * lean flat). Chord tones and tensions keep the chord's spelling; notes that kept their pitch keep
 * the teacher's.
 */
function leanOneWay(job: Job): void {
	const { notes, roots, midis, pitches, T } = job;
	const n = notes.length;
	let a = 0;
	while (a < n) {
		let b = a + 1;
		while (
			b < n &&
			roots[b] &&
			roots[b - 1] &&
			notes[b].start <= notes[b - 1].start + notes[b - 1].duration + 1e-9
		)
			b++;
		let moved = 0;
		for (let i = a; i < b; i++)
			if (roots[i] && midis[i] !== notes[i].midi && T.roles[landedAt(job, i)] === 'chromatic')
				moved++;
		if (moved === 0) {
			a = b;
			continue;
		}
		let fixed = 0;
		let source = 0;
		for (let i = a; i < b; i++) {
			const root = roots[i];
			if (!root) continue;
			if (T.roles[landedAt(job, i)] === 'tension') fixed += leanOf(root, pitches[i]);
			if (job.F.roles[job.semis[i]] !== 'chord-tone') source += leanOf(root, notes[i].pitch);
		}
		const want = fixed !== 0 ? Math.sign(fixed) : source > 0 ? 1 : -1;
		for (let i = a; i < b; i++) {
			const root = roots[i];
			if (!root || midis[i] === notes[i].midi) continue;
			if (T.roles[landedAt(job, i)] !== 'chromatic') continue;
			if (leanOf(root, pitches[i]) !== -want) continue;
			const p = readNote(pitches[i]);
			const letter = (p.letter + (want < 0 ? 1 : 6)) % 7;
			const alt = smallestMove(LS[letter], mod12(midis[i]));
			if (alt > 1 || alt < -1) continue;
			const octave = Math.floor((midis[i] - LS[letter] - alt) / 12) - 1;
			pitches[i] = formatPitch({ letter, alt, octave });
		}
		a = b;
	}
}

const pitchOf = (n: SoundingNote): PitchName => n.pitch;

function range(notes: readonly SoundingNote[], a: number, b: number): number[] {
	const out: number[] = [];
	for (let k = a; k <= b; k++) out.push(notes[k].index);
	return out;
}

/** Pairs of chord tones of a quality `span` semitones apart, moving in direction `d`. */
function matchingSpans(T: QualityTable, span: number, d: number): [number, number][] {
	const out: [number, number][] = [];
	for (let x = 0; x < 12; x++) {
		const y = mod12(x + d * span);
		if (T.roles[x] === 'chord-tone' && T.roles[y] === 'chord-tone') out.push([x, y]);
	}
	return out;
}

/**
 * The note a note approaches, or -1. Only notes outside the parent scale approach (an altered
 * tension or a chromatic note), and only chord tones or parent-scale notes are targets (those
 * are mapped first): a half step off the next note (a whole step when the note is outside every
 * scale of the chord), or within a whole step of the note after it when the note between lies on
 * the target's other side (an enclosure).
 */
function approachTarget(job: Job, i: number): number {
	const { notes, roots, isTone, F, semis } = job;
	// Steps of the parent scale itself (11 → 3 on a dominant) are melody, not approaches.
	if (F.inParentScale[semis[i]]) return -1;
	const here = notes[i].midi;
	const outside = !F.inScale[semis[i]];
	const next = i + 1;
	if (next < notes.length && (!roots[next] || isTone[next] || F.inParentScale[semis[next]])) {
		const d = Math.abs(notes[next].midi - here);
		if (d === 1 || (outside && d === 2)) return next;
	}
	const after = i + 2;
	if (after < notes.length && (!roots[after] || isTone[after] || F.inParentScale[semis[after]])) {
		const t = notes[after].midi;
		const d = here - t;
		const between = notes[next].midi - t;
		if (d !== 0 && Math.abs(d) <= 2 && between !== 0 && Math.sign(between) !== Math.sign(d))
			return after;
	}
	return -1;
}
