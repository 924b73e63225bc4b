/**
 * Line analysis for the teacher: a degree per note and the devices a line uses.
 *
 * What counts (common practice; thresholds decided here):
 * - arpeggio: three or more consecutive notes moving by thirds (3 or 4 semitones) in one
 *   direction, named by the triad or seventh chord they stack (a longer run is named by its
 *   first four notes); the label says which degrees it gives over the chord in force.
 * - chromatic fill: consecutive half steps in one direction between two chord tones of the chord
 *   in force, with at least two passing tones (a minor or major third filled).
 * - enclosure: a note on one side of a target and a note on the other, each within a whole step,
 *   then the target (a chord tone or an available tension).
 * - leap: a move of 8 semitones or more (a minor sixth and up, by sound: C to G# counts).
 * Device indices are the notes' own `index` values; `end` is inclusive.
 */
import { degreeOf, readNote, type Degree, type DegreeLabel } from './degrees';
import { formatNoteName, LETTER_SEMITONES } from './pitch';
import type { ChordContext, PitchName, SoundingNote } from './types';

export type DeviceKind = 'arpeggio' | 'chromatic-fill' | 'enclosure' | 'leap';

export interface Device {
	kind: DeviceKind;
	/** `index` of the first note of the device. */
	start: number;
	/** `index` of the last note, inclusive. */
	end: number;
	/** A sentence for the teacher. */
	label: string;
	/** Arpeggio: the chord it spells, as a symbol (`Fmaj7`). */
	chord?: string;
	/** Degrees of the device's notes over the chord in force, when there is one. */
	degrees?: DegreeLabel[];
	/** Leap: its size in semitones (signed, up positive). */
	semitones?: number;
}

export interface Analysis {
	/** Degree of each note over its chord in force; null before the first chord. */
	degrees: (Degree | null)[];
	devices: Device[];
}

/** Stacks of thirds (bottom up, semitones) and the symbol suffix of the chord they spell. */
const STACKS: Record<string, string> = {
	'4,3': '',
	'3,4': 'm',
	'3,3': 'dim',
	'4,4': '+',
	'4,3,4': 'maj7',
	'4,3,3': '7',
	'3,4,3': 'm7',
	'3,3,4': 'm7b5',
	'3,3,3': 'dim7',
	'3,4,4': 'mMaj7',
	'4,4,3': 'maj7#5'
};

/**
 * Upper-structure sounds: degrees an arpeggio gives over a quality, and the chord they make
 * (common practice; M. Levine, The Jazz Theory Book, 1995, from memory).
 */
const SOUNDS: Record<string, Record<string, string>> = {
	'7': {
		'b7 9 11 13': '9sus4 / 13sus4',
		'b7 9 11': '9sus4',
		'5 b7 9 11': '11',
		'3 5 b7 9': '9',
		'9 #11 13': '13#11',
		'3 5 b7 b9': '7b9',
		'b13 R #9': '7#5#9',
		'#11 b7 b9': '7b9#11'
	},
	maj7: {
		'3 5 7 9': 'maj9',
		'5 7 9': 'maj9',
		'9 #11 13': 'maj7#11',
		'7 9 #11 13': 'maj13#11'
	},
	m7: {
		'b3 5 b7 9': 'm9',
		'5 b7 9 11': 'm11',
		'b7 9 11 13': 'm13',
		'b7 9 11': 'm11'
	},
	m7b5: { 'b3 b5 b7 9': 'm9b5', 'b3 b5 b7': 'm7b5' }
};

const letterName = (pitch: PitchName): string => formatNoteName(readNote(pitch));
const sameChord = (a: ChordContext | null, b: ChordContext | null): boolean =>
	a === b || (!!a && !!b && a.symbol === b.symbol);
const onBeat = (start: number): boolean => Math.abs(start * 4 - Math.round(start * 4)) < 1e-9;

/** Labels of notes a..b, or undefined when one of them has no chord in force. */
function labelsOf(degrees: (Degree | null)[], a: number, b: number): DegreeLabel[] | undefined {
	const out: DegreeLabel[] = [];
	for (let k = a; k <= b; k++) {
		const d = degrees[k];
		if (!d) return undefined;
		out.push(d.label);
	}
	return out;
}

function list(words: string[]): string {
	if (words.length <= 1) return words.join('');
	return words.slice(0, -1).join(', ') + ' and ' + words[words.length - 1];
}

const SIMPLE_NAMES = ['unison', 'second', 'third', 'fourth', 'fifth', 'sixth', 'seventh'];
const ORDINALS = ['octave', 'ninth', 'tenth', 'eleventh', 'twelfth', 'thirteenth', 'fourteenth'];

/**
 * The spelled interval between two pitches in words, from their letters and sounds.
 * @example intervalWords('C4', 'Ab4') // 'minor sixth'
 */
export function intervalWords(lower: PitchName, upper: PitchName): string {
	const parse = (p: PitchName) => {
		const n = readNote(p);
		const octave = Number(/(-?\d+)$/.exec(p)?.[1] ?? 4);
		return {
			steps: octave * 7 + n.letter,
			midi: 12 * (octave + 1) + LETTER_SEMITONES[n.letter] + n.alt
		};
	};
	const a = parse(lower);
	const b = parse(upper);
	const steps = Math.abs(b.steps - a.steps);
	const semis = Math.abs(b.midi - a.midi);
	const simple = steps % 7;
	const base = LETTER_SEMITONES[simple] + 12 * Math.floor(steps / 7);
	const perfect = simple === 0 || simple === 3 || simple === 4;
	const diff = semis - base;
	let quality: string;
	if (perfect) quality = diff === 0 ? 'perfect' : diff > 0 ? 'augmented' : 'diminished';
	else
		quality = diff === 0 ? 'major' : diff === -1 ? 'minor' : diff > 0 ? 'augmented' : 'diminished';
	const number = steps < 7 ? SIMPLE_NAMES[steps] : (ORDINALS[steps - 7] ?? `${steps + 1}th`);
	if (number === 'octave' && quality === 'perfect') return 'octave';
	if (number === 'unison' && quality === 'perfect') return 'unison';
	return `${quality} ${number}`;
}

function arpeggios(notes: readonly SoundingNote[], degrees: (Degree | null)[]): Device[] {
	const out: Device[] = [];
	let i = 0;
	while (i < notes.length - 2) {
		const d = notes[i + 1].midi - notes[i].midi;
		const dir = Math.sign(d);
		let j = i + 1;
		while (j < notes.length) {
			const step = (notes[j].midi - notes[j - 1].midi) * dir;
			if (dir === 0 || (step !== 3 && step !== 4)) break;
			j++;
		}
		const length = j - i;
		if (length < 3) {
			i++;
			continue;
		}
		const named = notes.slice(i, i + Math.min(length, 4));
		const stacked = dir > 0 ? named : [...named].reverse();
		const steps = stacked.slice(1).map((n, k) => n.midi - stacked[k].midi);
		const suffix = STACKS[steps.join(',')];
		if (suffix !== undefined)
			out.push(describeArpeggio(notes, degrees, i, j - 1, stacked[0], suffix));
		i = j - 1;
	}
	return out;
}

function describeArpeggio(
	notes: readonly SoundingNote[],
	degrees: (Degree | null)[],
	a: number,
	b: number,
	bottom: SoundingNote,
	suffix: string
): Device {
	const symbol = letterName(bottom.pitch) + suffix;
	const names = notes.slice(a, b + 1).map((n) => letterName(n.pitch));
	const chord = notes[a].chord;
	const base = {
		kind: 'arpeggio' as const,
		start: notes[a].index,
		end: notes[b].index,
		chord: symbol
	};
	const kind = suffix.length > 0 && /7/.test(suffix) ? 'seventh-chord' : 'triad';
	const what =
		`${/^[AEF]/.test(symbol) ? 'An' : 'A'} ${symbol} ${kind === 'triad' ? 'triad' : ''}`.replace(
			/ $/,
			''
		);
	const labels = labelsOf(degrees, a, b);
	if (!chord || !labels) return { ...base, label: `${what} arpeggio (${names.join(' ')}).` };
	const allChordTones = degrees.slice(a, b + 1).every((d) => d?.role === 'chord-tone');
	if (allChordTones)
		return {
			...base,
			degrees: labels,
			label: `${what} arpeggio (${names.join(' ')}): the chord tones of ${chord.symbol}, ${labels.join(' ')}.`
		};
	// The chord is named by its first four notes (or three); so is the sound it makes.
	const named = labels.slice(0, Math.min(labels.length, 4));
	const up = bottom === notes[a];
	const ordered = (up ? labels : [...labels].reverse()).join(' ');
	const key = (up ? named : [...named].reverse()).join(' ');
	const sound = chord.quality ? SOUNDS[chord.quality]?.[key] : undefined;
	const colours = [
		...new Set(degrees.slice(a, b + 1).filter((d) => d && d.role !== 'chord-tone'))
	].map((d) => `the ${spoken(d!.label)}`);
	const from = spoken(degrees[up ? a : a + named.length - 1]?.label);
	return {
		...base,
		degrees: labels,
		label:
			`${what} arpeggio (${names.join(' ')}) laid over ${chord.symbol}, built on its ${from}: ` +
			`${ordered}` +
			(sound
				? `, the sound of ${chord.root}${sound.replace(' / ', ` / ${chord.root}`)}.`
				: colours.length
					? `; it adds ${list(colours)}.`
					: '.')
	};
}

function chromaticFills(notes: readonly SoundingNote[], degrees: (Degree | null)[]): Device[] {
	const out: Device[] = [];
	for (let a = 0; a < notes.length - 3; a++) {
		if (degrees[a]?.role !== 'chord-tone') continue;
		const d = notes[a + 1].midi - notes[a].midi;
		if (d !== 1 && d !== -1) continue;
		let b = a + 1;
		while (
			b < notes.length - 1 &&
			notes[b + 1].midi - notes[b].midi === d &&
			degrees[b]?.role !== 'chord-tone'
		)
			b++;
		if (
			b - a < 3 ||
			degrees[b]?.role !== 'chord-tone' ||
			!sameChord(notes[a].chord, notes[b].chord)
		)
			continue;
		const span = b - a;
		const chord = notes[a].chord!;
		const names = notes.slice(a, b + 1).map((n) => letterName(n.pitch));
		const labels = labelsOf(degrees, a, b);
		if (!labels) continue;
		const size =
			span === 4 ? 'major third' : span === 3 ? 'minor third' : `span of ${span} half steps`;
		const beats =
			onBeat(notes[a].start) && onBeat(notes[b].start) ? '; both chord tones fall on a beat' : '';
		out.push({
			kind: 'chromatic-fill',
			start: notes[a].index,
			end: notes[b].index,
			degrees: labels,
			label:
				`A chromatic fill of the ${size} from the ${spoken(labels[0])} ${d < 0 ? 'down' : 'up'} to the ` +
				`${spoken(labels[labels.length - 1])} of ${chord.symbol} (${names.join(' ')}: ${labels.join(' ')})${beats}.`
		});
		a = b - 1;
	}
	return out;
}

/** Whether a note is a target an enclosure can aim at: a chord tone or an available tension. */
const aimable = (d: Degree | null): boolean =>
	!d || d.role === 'chord-tone' || d.role === 'tension';

function enclosures(
	notes: readonly SoundingNote[],
	degrees: (Degree | null)[],
	arpeggios: readonly Device[]
): Device[] {
	const out: Device[] = [];
	// Two notes inside one arpeggio are its chord, not an approach to what follows (C E G B | A
	// over a change spells Cmaj7 and moves on; it does not enclose the A).
	const inArpeggio = (i: number): boolean =>
		arpeggios.some((a) => a.start <= notes[i].index && notes[i + 1].index <= a.end);
	for (let i = 0; i + 2 < notes.length; i++) {
		if (inArpeggio(i)) continue;
		const found = enclosureFrom(notes, degrees, i);
		if (found) {
			out.push(found);
			i = notes.findIndex((n) => n.index === found.end) - 1;
		}
	}
	return out;
}

/**
 * An enclosure starting at note i: one note on each side of a target, each within a whole step,
 * then any chromatic passing tones from the second note toward the target, then the target
 * (`"C7"F D ^D E`: F above, D below, D♯ passing, the 3). A tension that moves on by the same half
 * step to a chord tone is itself a passing tone, not the target (the D♯ there is no ♯9).
 */
function enclosureFrom(
	notes: readonly SoundingNote[],
	degrees: (Degree | null)[],
	i: number
): Device | null {
	for (let t = i + 2; t < notes.length && t <= i + 4; t++) {
		const target = notes[t].midi;
		const first = notes[i].midi - target;
		const second = notes[i + 1].midi - target;
		if (first === 0 || second === 0 || Math.sign(first) === Math.sign(second)) return null;
		if (Math.abs(first) > 2 || Math.abs(second) > 2) return null;
		// Notes between the second and the target: half steps toward the target, on its side.
		let passing = true;
		for (let k = i + 2; k < t && passing; k++) {
			const step = notes[k].midi - notes[k - 1].midi;
			passing = Math.abs(step) === 1 && Math.sign(step) === -Math.sign(second);
		}
		if (!passing) return null;
		const g = degrees[t];
		if (t > i + 2 && Math.sign(target - notes[t - 1].midi) !== -Math.sign(second)) return null;
		const next = t + 1 < notes.length ? notes[t + 1].midi - target : 0;
		const movesOn =
			t + 1 < notes.length &&
			Math.abs(next) === 1 &&
			Math.sign(next) === Math.sign(target - notes[t - 1].midi) &&
			Math.abs(target - notes[t - 1].midi) === 1 &&
			degrees[t + 1]?.role === 'chord-tone' &&
			g?.role !== 'chord-tone';
		if (movesOn) continue;
		if (!aimable(g)) return null;
		return describeEnclosure(notes, degrees, i, t);
	}
	return null;
}

function describeEnclosure(
	notes: readonly SoundingNote[],
	degrees: (Degree | null)[],
	i: number,
	t: number
): Device {
	const target = notes[t];
	const first = notes[i].midi - target.midi;
	const second = notes[i + 1].midi - target.midi;
	const g = degrees[t];
	const how = (x: number) => (Math.abs(x) === 1 ? 'a half step' : 'a whole step');
	const side = (x: number) => (x > 0 ? 'above' : 'below');
	// Letter names read better in a sentence than octave numbers (Bb, not Bb5).
	const name = (n: SoundingNote) => n.pitch.replace(/-?\d+$/, '');
	const chromatic =
		Math.abs(first) === 1 && Math.abs(second) === 1 ? 'A chromatic enclosure' : 'An enclosure';
	const targetName = g ? `the ${spoken(g.label)} (${name(target)})` : name(target);
	const passing = notes.slice(i + 2, t).map(name);
	const through = passing.length
		? `, ${list(passing)} ${passing.length === 1 ? 'a passing tone' : 'passing tones'}`
		: '';
	return {
		kind: 'enclosure',
		start: notes[i].index,
		end: target.index,
		degrees: labelsOf(degrees, i, t),
		label:
			`${chromatic} of ${targetName}${target.chord ? ` over ${target.chord.symbol}` : ''}: ${name(notes[i])} ` +
			`${how(first)} ${side(first)}, ${name(notes[i + 1])} ${how(second)} ${side(second)}${through}, then the target.`
	};
}

/** A degree as a sentence says it: the root by name, the others by number (`the 9`). */
function spoken(label: DegreeLabel | undefined): string {
	return label === 'R' ? 'root' : (label ?? '');
}

function leaps(notes: readonly SoundingNote[]): Device[] {
	const out: Device[] = [];
	for (let i = 0; i + 1 < notes.length; i++) {
		const semitones = notes[i + 1].midi - notes[i].midi;
		if (Math.abs(semitones) < 8) continue;
		const [lo, hi] = semitones > 0 ? [notes[i], notes[i + 1]] : [notes[i + 1], notes[i]];
		const words = intervalWords(lo.pitch, hi.pitch);
		out.push({
			kind: 'leap',
			start: notes[i].index,
			end: notes[i + 1].index,
			semitones,
			label: `A leap of ${/^[aeiou]/.test(words) ? 'an' : 'a'} ${words} ${semitones > 0 ? 'up' : 'down'} (${notes[i].pitch} to ${notes[i + 1].pitch}, ${Math.abs(semitones)} semitones).`
		});
	}
	return out;
}

/**
 * Degrees and devices of a line.
 * @example analyseNotes(lineOver('G7', 'F4 A4 C5 E5')).devices[0].chord // 'Fmaj7'
 */
export function analyseNotes(notes: readonly SoundingNote[]): Analysis {
	const degrees = notes.map((n) => (n.chord ? degreeOf(n.pitch, n.chord) : null));
	const found = arpeggios(notes, degrees);
	const devices = [
		...found,
		...chromaticFills(notes, degrees),
		...enclosures(notes, degrees, found),
		...leaps(notes)
	].sort((x, y) => x.start - y.start || x.end - y.end);
	return { degrees, devices };
}
