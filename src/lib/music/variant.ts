/**
 * Rendering one variant of a prepared lick: its quality layer moved to the target key, chord
 * tones on the chord's letters, written for the instrument, emitted as abc with degrees per note.
 */
import { chordTemplate, emitAbc, transposeChordSymbol } from './abc/emit';
import { speakWarnings, type Speaker } from './speech';
import { type ParsedAbc } from './abc/parse';
import type { AbcError } from './abc/tokenize';
import { readNote, type Degree, type DegreeLabel } from './degrees';
import { analyseNotes, type Device } from './analysis';
import {
	fitToRange,
	getInstrument,
	INSTRUMENT_IDS,
	isInstrumentId,
	type InstrumentId
} from './instruments';
import { formatKeyField, type KeySignature, type TritoneSpelling } from './keys';
import {
	chromaOf,
	formatNoteName,
	formatPitch,
	LETTER_SEMITONES,
	midiOf,
	mod12,
	parsePitchName,
	transposePitch,
	type SpelledNote,
	type SpelledPitch,
	type Steps
} from './pitch';
import { simplifyNoteName, simplifySpelling } from './spelling';
import { planKeys, shiftPlan, transposeNoteName, type KeyPlan } from './transpose';
import {
	type ChordContext,
	type KeyName,
	type MusicWarning,
	type PitchName,
	type QualityId,
	type SoundingNote
} from './types';
import type { PreparedLick } from './prepare';
import { VariantRequestError, readKeyName } from './prepare';
import type { QualityLayer } from './layer';
import { layerFor } from './layer';

/** One sounding note of a variant, at concert pitch. */
export interface VariantNote {
	index: number;
	pitch: PitchName;
	midi: number;
	start: number;
	duration: number;
	/** Degree over the chord in force (by semitones above its root), null without a chord. */
	degree: DegreeLabel | null;
	/** What that degree is over the chord's quality (a tension, a chord tone…); null without one. */
	role: Degree['role'] | null;
	chord: ChordContext | null;
	/** The note as the learner's part writes it (the same as `pitch` at concert pitch). */
	writtenPitch: PitchName;
	/** The chord symbol in force as the learner's part writes it, or null. */
	writtenChord: string | null;
}

export interface VariantOptions {
	/** Target key tonic (`Eb`, `F#`); the lick's own key when absent. */
	to?: KeyName;
	/** Chord quality to re-map the lick over; its own (first chord symbol) when absent. */
	quality?: QualityId;
	/** Instrument id the abc is written for; concert pitch when absent. */
	instrument?: string;
	/** Spelling of the key a tritone from C (used where a key is chosen by pitch class). */
	tritone?: TritoneSpelling;
	/** Extra octaves to move the line (before any instrument fitting). */
	octaves?: number;
	/** Also recognise devices (arpeggios, fills, enclosures, leaps) in the variant. */
	analyse?: boolean;
}

export interface VariantSuccess {
	ok: true;
	/** The abc written for the instrument (concert pitch without one). */
	abc: string;
	/** Concert key tonic of the variant, e.g. `Eb`. */
	key: KeyName;
	/** The K: value written in the output (for a transposing instrument, the written key). */
	writtenKey: string;
	/** Concert key tonic (the same as `key`, named for screens that show both). */
	concertKey: KeyName;
	/** Tonic of the key the learner's part is written in (`D` for B-flat trumpet in concert C). */
	writtenTonic: KeyName;
	/** Mode of the lick's key (`major`, `minor`, `dorian`…); the written key has the same mode. */
	mode: string;
	/** The lick's meter as its `M:` says (`4/4`, `6/8`, `C`), '' without one. */
	meter: string;
	/** Beats of a count-in bar for that meter (4/4 → 4, 6/8 → 2). */
	beatsPerBar: number;
	/** Quarter-note beats a minute from the lick's `Q:`, or null without one. */
	tempo: number | null;
	quality: QualityId | null;
	instrument: string;
	warnings: MusicWarning[];
	notes: VariantNote[];
	/** Devices the line uses, when asked for with `analyse`. */
	devices?: Device[];
	/** True when a teacher's hand-written version for this quality replaced the computed one. */
	handWritten: boolean;
}

export type VariantResult = VariantSuccess | { ok: false; error: AbcError };

const NONE: readonly MusicWarning[] = [];

/** One warnings array for a variant; most variants have none, so nothing is copied then. */
function collectWarnings(...lists: (readonly MusicWarning[])[]): MusicWarning[] {
	const out: MusicWarning[] = [];
	for (const list of lists) for (const w of list) out.push(w);
	return out;
}

/** Chord texts and contexts of a layer moved by an interval, spelled for the keys in force. */
function moveChords(
	tune: ParsedAbc,
	layer: QualityLayer,
	by: Steps,
	keys: readonly KeySignature[]
): MovedChords {
	const n = layer.chordTexts.length;
	const texts: string[] = new Array(n);
	const contexts: (ChordContext | null)[] = new Array(n);
	const rootChromas: number[] = new Array(n).fill(0);
	const roots: (SpelledNote | null)[] = new Array(n).fill(null);
	let keyIndex = 0;
	const moved: SpelledNote[] = [];
	for (let i = 0; i < n; i++) {
		const token = tune.chordSymbols[i].token;
		while (keyIndex + 1 < tune.keys.length && tune.keys[keyIndex + 1].token < token) keyIndex++;
		const c = layer.contexts[i];
		if (!c) {
			texts[i] = layer.chordTexts[i];
			contexts[i] = null;
			continue;
		}
		moved.length = 0;
		const text = transposeChordSymbol(layer.chordTexts[i], by, keys[keyIndex].accidentals, moved);
		const template = chordTemplate(layer.chordTexts[i]);
		texts[i] = text;
		roots[i] = moved.length ? moved[0] : readNote(c.root);
		rootChromas[i] = chromaOf(roots[i] as SpelledNote);
		contexts[i] = {
			symbol: text,
			root: moved.length ? formatNoteName(moved[0]) : c.root,
			quality: c.quality,
			bass: c.bass && template.bass >= 0 ? formatNoteName(moved[template.bass]) : c.bass
		};
	}
	return { texts, contexts, rootChromas, roots };
}

/** Chord symbols of a variant: texts as written, contexts, and their spelled roots. */
interface MovedChords {
	texts: string[];
	contexts: (ChordContext | null)[];
	rootChromas: number[];
	roots: (SpelledNote | null)[];
}

/**
 * Write every chord tone and tension on the letter its interval gives above the root of the
 * chord in force, whatever the key signature (common practice: the third of G#7 is B#, not C).
 * A tension whose letter would need a double sharp or flat keeps the key's spelling; chromatic
 * notes keep it too. Grace notes keep the spelling they moved with.
 */
function spellOnChords(
	lick: PreparedLick,
	layer: QualityLayer,
	pitches: SpelledPitch[],
	chords: MovedChords
): void {
	const { heads } = lick.tune;
	for (let i = 0; i < heads.length; i++) {
		const h = heads[i];
		if (h.grace) continue;
		const ci = lick.chordOfNote[h.sounding];
		if (ci < 0) continue;
		const shape = layer.shapes[ci];
		const root = chords.roots[ci];
		if (!shape || !root) continue;
		const p = pitches[i];
		const midi = midiOf(p);
		const s = mod12(midi - chords.rootChromas[ci]);
		const iv = shape.spelling[s];
		if (!iv) continue;
		const letter = (((root.letter + iv.steps) % 7) + 7) % 7;
		if (letter === p.letter) continue;
		const octave = Math.floor((midi - LETTER_SEMITONES[letter] + 6) / 12) - 1;
		const alt = midi - (12 * (octave + 1) + LETTER_SEMITONES[letter]);
		if (alt > 2 || alt < -2 || ((alt === 2 || alt === -2) && shape.roles[s] !== 'chord-tone'))
			continue;
		pitches[i] = { letter, alt, octave };
	}
}

/** Pitches of a layer moved by an interval and spelled for the key in force. */
function movePitches(
	tune: ParsedAbc,
	pitches: readonly SpelledPitch[],
	by: Steps,
	keys: readonly KeySignature[]
): SpelledPitch[] {
	const out: SpelledPitch[] = new Array(pitches.length);
	const heads = tune.heads;
	for (let i = 0; i < pitches.length; i++) {
		out[i] = simplifySpelling(transposePitch(pitches[i], by), keys[heads[i].key].accidentals);
	}
	return out;
}

/** The concert key plan for a target, cached on the lick (a grid asks for each key 8 times). */
function concertPlan(
	lick: PreparedLick,
	target: SpelledNote | null,
	to: string | undefined,
	tritone: TritoneSpelling,
	octaves: number
): KeyPlan {
	const id = `${to ?? ''}|${tritone}|${octaves}`;
	let plan = lick.plans.get(id);
	if (!plan) {
		plan = planKeys(lick.keys, target, { tritone, octaves });
		lick.plans.set(id, plan);
	}
	return plan;
}

/**
 * One variant of a prepared lick. Throws `VariantRequestError` for an unknown key, quality or
 * instrument.
 * @example renderVariant(lick, { to: 'Eb' }).key // 'Eb'
 */
export function renderVariant(lick: PreparedLick, options: VariantOptions = {}): VariantSuccess {
	const version = options.quality ? lick.versions.get(options.quality) : undefined;
	if (version) return renderHandWritten(lick, version, options);
	const { tune } = lick;
	const tritone = options.tritone ?? 'Gb';
	if (tritone !== 'Gb' && tritone !== 'F#') {
		throw new VariantRequestError(`“${String(tritone)}” is not a tritone spelling: use Gb or F#.`);
	}
	const target = options.to === undefined ? null : readKeyName(options.to);
	const octaves = options.octaves ?? 0;
	if (!Number.isInteger(octaves) || Math.abs(octaves) > 3) {
		throw new VariantRequestError(
			`“${String(octaves)}” is not an octave shift: use a whole number from -3 to 3.`
		);
	}
	const layer = layerFor(lick, options.quality ?? null);
	const concert = concertPlan(lick, target, options.to, tritone, octaves);
	const instrumentId = options.instrument === undefined ? null : options.instrument;
	if (instrumentId !== null && !isInstrumentId(instrumentId)) {
		throw new VariantRequestError(
			`“${String(instrumentId)}” is not an instrument: use one of ${INSTRUMENT_IDS.join(', ')}.`
		);
	}
	const instrument = instrumentId ?? 'concert';

	const concertPitches = movePitches(tune, layer.pitches, concert.interval, concert.keys);
	const concertChords = moveChords(tune, layer, concert.interval, concert.keys);
	spellOnChords(lick, layer, concertPitches, concertChords);
	const {
		plan: written,
		fitWarnings,
		octaveShift
	} = writtenPlan(instrumentId, lick.keys, concert, tune, concertPitches, tritone);
	const writtenPitches =
		written === concert
			? concertPitches
			: movePitches(tune, layer.pitches, written.interval, written.keys);
	const writtenChords =
		written === concert ? concertChords : moveChords(tune, layer, written.interval, written.keys);
	if (written !== concert) spellOnChords(lick, layer, writtenPitches, writtenChords);

	const abc = emitAbc(tune, {
		keys: written.keys,
		pitches: writtenPitches,
		chordSymbols: writtenChords.texts
	});
	// The octave chosen to fit the instrument's range moves what it sounds too: the notes (and so
	// playback) must match the staff, an octave above the concert line or not.
	const soundingPitches =
		octaveShift === 0 ? concertPitches : shiftOctaves(concertPitches, octaveShift);
	// Degrees by semitones over each chord symbol, read once per layer: moving keeps the quality.
	const rows = layer.degrees;
	const notes: VariantNote[] = new Array(tune.notes.length);
	const { heads } = tune;
	// What the learner reads, for sentences about the line: the written part when it differs.
	const shown: SoundingNote[] | null =
		options.analyse && written !== concert ? new Array(tune.notes.length) : null;
	for (let i = 0; i < heads.length; i++) {
		const h = heads[i];
		if (h.grace || h.continuation) continue;
		const src = tune.notes[h.sounding];
		const p = soundingPitches[i];
		const midi = midiOf(p);
		// The chord in force is the same symbol as in the source, now moved.
		const ci = lick.chordOfNote[h.sounding];
		const chord = ci < 0 ? null : concertChords.contexts[ci];
		let label: DegreeLabel | null = null;
		let role: VariantNote['role'] = null;
		const row = ci < 0 ? null : rows[ci];
		if (chord && row) {
			const degree = row[mod12(midi - concertChords.rootChromas[ci])];
			label = degree.label;
			role = degree.role;
		}
		notes[h.sounding] = {
			index: src.index,
			pitch: formatPitch(p),
			midi,
			start: src.start,
			duration: src.duration,
			degree: label,
			role,
			chord,
			writtenPitch: formatPitch(writtenPitches[i]),
			writtenChord: ci < 0 ? null : writtenChords.contexts[ci] ? writtenChords.texts[ci] : null
		};
		if (shown) {
			const wp = writtenPitches[i];
			shown[h.sounding] = {
				index: src.index,
				pitch: formatPitch(wp),
				midi: midiOf(wp),
				start: src.start,
				duration: src.duration,
				chord: ci < 0 ? null : writtenChords.contexts[ci]
			};
		}
	}
	const firstKey = concert.keys[0];
	const analysis = options.analyse ? analyseSafely(shown ?? notes) : null;
	const shownKey = written.keys[0];
	const devices = analysis?.devices;
	// K:none has no tonic: the key is the one asked for, if any.
	const key = firstKey.none
		? target
			? formatNoteName(target)
			: 'none'
		: formatNoteName(firstKey.tonic);
	const writtenTonic = shownKey.none
		? written === concert
			? key
			: key === 'none'
				? 'none'
				: formatNoteName(
						simplifyNoteName(
							transposeNoteName(readNote(key), instrumentSteps(written, concert)),
							[0, 0, 0, 0, 0, 0, 0]
						)
					)
		: formatNoteName(shownKey.tonic);
	const result: VariantSuccess = {
		ok: true,
		abc,
		key,
		writtenKey: formatKeyField(written.keys[0]),
		concertKey: key,
		writtenTonic,
		mode: firstKey.mode,
		meter: tune.meter,
		beatsPerBar: lick.beatsPerBar,
		tempo: tune.tempo,
		quality: layer.quality,
		instrument,
		warnings: speakWarnings(
			collectWarnings(
				tune.warnings,
				layer.warnings,
				concert.warnings,
				written === concert ? NONE : written.warnings,
				fitWarnings,
				analysis?.warning ? [analysis.warning] : NONE
			),
			new VariantSpeaker(written.interval, shownKey.accidentals, notes)
		),
		notes,
		handWritten: false
	};
	if (devices) result.devices = devices;
	return result;
}

/** How sentences about a lick name its chords and notes in the variant the learner reads. */
class VariantSpeaker implements Speaker {
	constructor(
		private readonly by: Steps,
		private readonly accidentals: readonly number[],
		private readonly notes: readonly VariantNote[]
	) {}

	chord(symbol: string): string {
		return transposeChordSymbol(symbol, this.by, this.accidentals);
	}

	source(_note: number, pitch: string): string {
		const p = parsePitchName(pitch);
		if (!p) return pitch;
		return formatPitch(simplifySpelling(transposePitch(p, this.by), this.accidentals));
	}

	output(note: number, pitch: string): string {
		return this.notes[note]?.writtenPitch ?? pitch;
	}
}

/** The same pitches some octaves away. */
function shiftOctaves(pitches: readonly SpelledPitch[], octaves: number): SpelledPitch[] {
	const out: SpelledPitch[] = new Array(pitches.length);
	for (let i = 0; i < pitches.length; i++) {
		const p = pitches[i];
		out[i] = { letter: p.letter, alt: p.alt, octave: p.octave + octaves };
	}
	return out;
}

/**
 * A variant from a teacher's hand-written version: the version is moved to the target key as
 * written (no re-mapping), starting from the lick's own key when no target is named.
 */
function renderHandWritten(
	lick: PreparedLick,
	version: PreparedLick,
	options: VariantOptions
): VariantSuccess {
	const home = lick.keys[0];
	const to = options.to ?? (home && !home.none ? formatNoteName(home.tonic) : undefined);
	const result = renderVariant(version, { ...options, to, quality: undefined });
	const quality = options.quality as QualityId;
	const warnings =
		version.quality === quality
			? result.warnings
			: [
					...result.warnings,
					{
						code: 'version-quality',
						message: `The hand-written ${quality} version's first chord symbol reads as ${version.quality ?? 'no known quality'}, not ${quality}.`
					}
				];
	return { ...result, quality, warnings, handWritten: true };
}

/**
 * Devices of a line. Analysis is a bonus on top of the variant: should it fail on an odd line
 * (for example notes before the first chord symbol), the variant still stands, with a warning.
 */
function analyseSafely(notes: readonly SoundingNote[]): {
	devices?: Device[];
	warning?: MusicWarning;
} {
	try {
		return { devices: analyseNotes(notes).devices };
	} catch (e) {
		return {
			warning: {
				code: 'analysis-failed',
				message: `The devices of this line could not be worked out (${e instanceof Error ? e.message : String(e)}).`
			}
		};
	}
}

/** The interval from the concert part to the written one. */
function instrumentSteps(written: KeyPlan, concert: KeyPlan): Steps {
	return {
		steps: written.interval.steps - concert.interval.steps,
		semitones: written.interval.semitones - concert.interval.semitones
	};
}

/** The written key plan for an instrument: its transposition plus the octave that fits its range. */
function writtenPlan(
	instrument: InstrumentId | null,
	keys: readonly KeySignature[],
	concert: KeyPlan,
	tune: ParsedAbc,
	pitches: readonly SpelledPitch[],
	tritone: TritoneSpelling
): { plan: KeyPlan; fitWarnings: MusicWarning[]; octaveShift: number } {
	if (instrument === null) return { plan: concert, fitWarnings: [], octaveShift: 0 };
	const row = getInstrument(instrument);
	const midis: number[] = [];
	for (let i = 0; i < tune.heads.length; i++) {
		const h = tune.heads[i];
		if (!h.grace && !h.continuation) midis.push(midiOf(pitches[i]));
	}
	const fit = fitToRange(midis, instrument);
	const by: Steps = {
		steps: row.steps + 7 * fit.octaveShift,
		semitones: row.semitones + 12 * fit.octaveShift
	};
	// An instrument that reads at concert pitch or octaves from it keeps the concert key's
	// spelling; a transposing one gets the spelling its written key takes by the tritone setting.
	const octaves = by.semitones % 12 === 0 && by.steps % 7 === 0;
	const shifted = shiftPlan(keys, concert, by, tritone, octaves ? 'keep' : 'setting');
	const clefKeys = shifted.keys.map((k) => withClef(k, row.clef));
	return {
		plan: { ...shifted, keys: clefKeys },
		fitWarnings: fit.warnings,
		octaveShift: fit.octaveShift
	};
}

const CLEF_TEXT = /(^|\s)(clef=\S+|treble(?:[+-]8)?|bass(?:[+-]8)?|alto|tenor|perc)(?=\s|$)/g;

/** The key with the instrument's clef in its K: text (abc 2.1 §4.6), other settings kept. */
function withClef(key: KeySignature, clef: string): KeySignature {
	const rest = key.rest.replace(CLEF_TEXT, ' ').trim();
	const clefText = clef === 'treble' ? '' : `clef=${clef}`;
	const next = [clefText, rest].filter(Boolean).join(' ');
	return next === key.rest ? key : { ...key, rest: next };
}
