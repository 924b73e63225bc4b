/**
 * The music engine's facade: abc in, a variant out (key, chord quality, instrument), or the whole
 * grid of variants from one parse. Parsing happens once per lick; each variant is a walk over the
 * parsed note heads with small integer arithmetic and one pass of the emitter.
 */
import { chordTemplate, emitAbc, transposeChordSymbol } from './abc/emit';
import { speakWarnings, type Speaker } from './speech';
import { parseAbc, type ParsedAbc } from './abc/parse';
import type { AbcError } from './abc/tokenize';
import { formatChordSymbol, parseChordSymbol } from './chord-symbol';
import { degreeInShape, readNote, type Degree, type DegreeLabel } from './degrees';
import { chordShape, type ChordShape } from './chord-shape';
import { remapNotes } from './remap';
import { analyseNotes, type Device } from './analysis';
import {
	fitToRange,
	getInstrument,
	INSTRUMENT_IDS,
	isInstrumentId,
	type InstrumentId
} from './instruments';
import { isQualityId } from './qualities';
import { formatKeyField, type KeySignature, type TritoneSpelling } from './keys';
import {
	chromaOf,
	formatNoteName,
	formatPitch,
	LETTER_SEMITONES,
	midiOf,
	mod12,
	MusicInvariantError,
	parseNoteName,
	parsePitchName,
	transposePitch,
	type SpelledNote,
	type SpelledPitch,
	type Steps
} from './pitch';
import { simplifyNoteName, simplifySpelling } from './spelling';
import { planKeys, shiftPlan, transposeNoteName, type KeyPlan } from './transpose';
import { beatsPerBar } from './meter';
import {
	QUALITY_IDS,
	type ChordContext,
	type KeyName,
	type MusicWarning,
	type PitchName,
	type QualityId,
	type SoundingNote
} from './types';

export type { AbcError } from './abc/tokenize';

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

/** A lick parsed once, ready for any number of variants. */
export interface PreparedLick {
	tune: ParsedAbc;
	/** The lick's own chord quality: that of its first chord symbol, or null. */
	quality: QualityId | null;
	/** Re-mapped versions by quality, in the lick's own key, computed on first use. */
	layers: Map<QualityId | null, QualityLayer>;
	/** Concert key plans by target (`to|tritone|octaves`), computed on first use. */
	plans: Map<string, KeyPlan>;
	/** The tune's key signatures, in order. */
	keys: KeySignature[];
	/** For each sounding note, the index of the chord symbol in force, or -1. */
	chordOfNote: number[];
	/** Teachers' hand-written versions by quality; each replaces the computed re-mapping. */
	versions: Map<QualityId, PreparedLick>;
}

/** Hand-written versions of a lick, by the quality each is written over (abc text each). */
export type HandWrittenVersions = Partial<Record<QualityId, string>>;

const NONE: readonly MusicWarning[] = [];

/** One warnings array for a variant; most variants have none, so nothing is copied then. */
function collectWarnings(...lists: (readonly MusicWarning[])[]): MusicWarning[] {
	const out: MusicWarning[] = [];
	for (const list of lists) for (const w of list) out.push(w);
	return out;
}

/** The lick over one chord quality, still in its own key. */
interface QualityLayer {
	quality: QualityId | null;
	/** A pitch per note head. */
	pitches: SpelledPitch[];
	/** Chord symbol texts (without quotes) and contexts, one per chord symbol of the tune. */
	chordTexts: string[];
	contexts: (ChordContext | null)[];
	/** What each pitch class is over each chord symbol (degree, role, letter), or null. */
	shapes: (ChordShape | null)[];
	warnings: MusicWarning[];
}

export type PrepareResult =
	{ ok: true; lick: PreparedLick } | { ok: false; error: AbcError & { version?: QualityId } };

/** Errors in the request rather than in the abc; the message names the bad value. */
export class VariantRequestError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'VariantRequestError';
	}
}

/**
 * The chord in force from a chord symbol's text. A symbol naming several chords ("C7 F7", two
 * in one bar) is in force as its first chord; all of its roots are transposed.
 */
const readChord = (symbol: string): ChordContext | null => {
	const parsed = parseChordSymbol(symbol) ?? parseChordSymbol(symbol.trim().split(/\s+/)[0]);
	return (
		parsed && {
			symbol: symbol.trim(),
			root: parsed.root,
			quality: parsed.quality,
			bass: parsed.bass
		}
	);
};

/**
 * Parse a lick once, with any hand-written versions for other qualities. An error in a version
 * names that version's quality; its line and column count within the version's own text.
 * @example prepareLick('X:1\nK:C\n"C7"CEGB|').lick.quality // '7'
 */
export function prepareLick(abc: string, versions: HandWrittenVersions = {}): PrepareResult {
	const prepared = prepareOne(abc);
	if (!prepared.ok) return prepared;
	for (const [quality, text] of Object.entries(versions)) {
		if (!isQualityId(quality)) {
			return {
				ok: false,
				error: {
					message: `A hand-written version is filed under “${quality}”, which is not a chord quality: use one of ${QUALITY_IDS.join(', ')}.`
				}
			} as PrepareResult;
		}
		if (typeof text !== 'string') continue;
		const version = prepareOne(text);
		if (!version.ok) {
			return {
				ok: false,
				error: {
					...version.error,
					message: `In the hand-written ${quality} version: ${version.error.message}`,
					version: quality
				}
			};
		}
		prepared.lick.versions.set(quality, version.lick);
	}
	return prepared;
}

function prepareOne(abc: string): PrepareResult {
	const parsed = parseAbc(abc, readChord);
	if (!parsed.ok) return parsed;
	const { tune } = parsed;
	const first = tune.chordSymbols.find((c) => c.context !== null);
	const quality = first?.context?.quality ?? null;
	const own: QualityLayer = {
		quality,
		pitches: tune.heads.map((h) => h.pitch),
		chordTexts: tune.chordSymbols.map((c) => c.text),
		contexts: tune.chordSymbols.map((c) => c.context),
		shapes: tune.chordSymbols.map((c) => c.context && chordShape(c.context)),
		warnings: []
	};
	// A quoted text that names no chord stays as written; say so rather than drop it silently.
	const unread = tune.chordSymbols
		.map((c) => c.text)
		.filter((text, i) => tune.chordSymbols[i].context === null && !/^\s*N\.?C\.?\s*$/i.test(text));
	if (unread.length) {
		tune.warnings.push({
			code: 'unknown-chord',
			message: `${unread.map((t) => `“${t}”`).join(', ')} ${unread.length === 1 ? 'is not a chord symbol we read: it is' : 'are not chord symbols we read: they are'} kept as written, in every key, and the notes under ${unread.length === 1 ? 'it get' : 'them get'} no degrees.`
		});
	}
	const chordOfNote = tune.notes.map((n) =>
		n.chord ? tune.chordSymbols.findIndex((c) => c.context === n.chord) : -1
	);
	return {
		ok: true,
		lick: {
			tune,
			quality,
			layers: new Map([[quality, own]]),
			plans: new Map(),
			keys: tune.keys.map((k) => k.key),
			chordOfNote,
			versions: new Map()
		}
	};
}

/**
 * Read a target key name; throws a request error naming the bad value.
 * @example readKeyName('Eb') // { letter: 2, alt: -1 }
 */
export function readKeyName(name: string): SpelledNote {
	const n = typeof name === 'string' ? parseNoteName(name) : null;
	if (!n || Math.abs(n.alt) > 1) {
		throw new VariantRequestError(
			`“${String(name)}” is not a key: name a tonic such as C, Eb or F# (one sharp or flat at most).`
		);
	}
	return n;
}

/** The lick re-mapped over another quality (harmony's `remapNotes`), cached on the lick. */
function layerFor(lick: PreparedLick, quality: QualityId | null): QualityLayer {
	const cached = lick.layers.get(quality);
	if (cached) return cached;
	const from = lick.quality;
	if (quality === null) return lick.layers.get(from) as QualityLayer;
	if (!isQualityId(quality)) {
		throw new VariantRequestError(
			`“${String(quality)}” is not a chord quality: use one of ${QUALITY_IDS.join(', ')}.`
		);
	}
	if (from === null) {
		throw new VariantRequestError(
			'This lick has no chord symbol that names a quality, so it cannot be re-mapped: add one such as "C7" before the first note.'
		);
	}
	const { tune } = lick;
	const home = tune.chordSymbols.find((c) => c.context)?.context as ChordContext;
	const homeChroma = chromaOf(parseNoteName(home.root) as SpelledNote);
	const remapped = remapNotes(tune.notes, { from, to: quality, root: home.root });
	const pitches = tune.heads.map((h) => {
		if (h.grace) return h.pitch;
		const p = parsePitchName(remapped.pitches[h.sounding]);
		if (!p) throw new MusicInvariantError(`Re-mapping gave no pitch for note ${h.sounding}`);
		return p;
	});
	// Grace notes ornament the note after them: they move as that note moved, so a grace a half
	// step below the 3rd stays a half step below it when the 3rd becomes a b3.
	for (let i = tune.heads.length - 1, next = -1; i >= 0; i--) {
		const h = tune.heads[i];
		if (!h.grace) {
			next = i;
			continue;
		}
		if (next < 0) continue;
		const before = tune.heads[next].pitch;
		const after = pitches[next];
		const by: Steps = {
			steps: after.octave * 7 + after.letter - (before.octave * 7 + before.letter),
			semitones: midiOf(after) - midiOf(before)
		};
		pitches[i] = transposePitch(h.pitch, by);
	}
	// The chord symbols the line is re-mapped over change with it (same root, new quality).
	const chordTexts: string[] = [];
	const contexts: (ChordContext | null)[] = [];
	tune.chordSymbols.forEach((cs) => {
		const c = cs.context;
		const text = cs.text;
		const rooted = c && parseNoteName(c.root);
		if (c && rooted && (c.quality === from || chromaOf(rooted) === homeChroma)) {
			const symbol = formatChordSymbol({ root: c.root, suffix: quality, bass: c.bass });
			chordTexts.push(symbol);
			contexts.push({ symbol, root: c.root, quality, bass: c.bass });
		} else {
			chordTexts.push(text);
			contexts.push(c);
		}
	});
	const shapes = contexts.map((c) => c && chordShape(c));
	const layer = { quality, pitches, chordTexts, contexts, shapes, warnings: remapped.warnings };
	lick.layers.set(quality, layer);
	return layer;
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
		octaveShift === 0
			? concertPitches
			: concertPitches.map((p) => ({ ...p, octave: p.octave + octaveShift }));
	const notes: VariantNote[] = new Array(tune.notes.length);
	const { heads } = tune;
	// What the learner reads, for sentences about the line: the written part when it differs.
	const shown: SoundingNote[] | null = written === concert ? null : new Array(tune.notes.length);
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
		const shape = ci < 0 ? null : layer.shapes[ci];
		if (chord && shape) {
			const degree = degreeInShape(shape, midi - concertChords.rootChromas[ci], chord.quality);
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
	const speaker: Speaker = {
		chord: (symbol) => transposeChordSymbol(symbol, written.interval, shownKey.accidentals),
		source: (_, pitch) => {
			const p = parsePitchName(pitch);
			if (!p) return pitch;
			return formatPitch(
				simplifySpelling(transposePitch(p, written.interval), shownKey.accidentals)
			);
		},
		output: (n, pitch) => notes[n]?.writtenPitch ?? pitch
	};
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
	return {
		ok: true,
		abc,
		key,
		writtenKey: formatKeyField(written.keys[0]),
		concertKey: key,
		writtenTonic,
		mode: firstKey.mode,
		meter: tune.meter,
		beatsPerBar: beatsPerBar(tune.meter),
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
			speaker
		),
		notes,
		...(devices ? { devices } : {}),
		handWritten: false
	};
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

/**
 * Parse and render one variant; errors in the abc come back positioned, errors in the request
 * (an unknown key, quality or instrument) as a message.
 * @example computeVariant({ abc: 'X:1\nK:Bb\n"Bb7"B2|', to: 'C' }).abc // 'X:1\nK:C\n"C7"c2|'
 */
export function computeVariant(
	request: { abc: string; versions?: HandWrittenVersions } & VariantOptions
): VariantResult | { ok: false; error: { message: string; line?: number; column?: number } } {
	if (typeof request.abc !== 'string')
		return { ok: false, error: { message: 'The abc text is missing.' } };
	const prepared = prepareLick(request.abc, request.versions);
	if (!prepared.ok) return prepared;
	try {
		return renderVariant(prepared.lick, { analyse: true, ...request });
	} catch (e) {
		if (e instanceof VariantRequestError) return { ok: false, error: { message: e.message } };
		throw e;
	}
}

export interface GridResult {
	ok: true;
	variants: VariantSuccess[];
}

/**
 * Every key × quality variant of a lick for one instrument, parsing once.
 * @example computeGrid(abc, ['C', 'F'], ['7', 'm7'], 'concert').variants.length // 4
 */
export function computeGrid(
	abc: string,
	keys: readonly KeyName[],
	qualities: readonly QualityId[],
	instrument?: string,
	tritone: TritoneSpelling = 'Gb',
	versions: HandWrittenVersions = {}
): GridResult | { ok: false; error: { message: string; line?: number; column?: number } } {
	const prepared = prepareLick(abc, versions);
	if (!prepared.ok) return prepared;
	const variants: VariantSuccess[] = [];
	try {
		for (const to of keys) {
			for (const quality of qualities) {
				variants.push(renderVariant(prepared.lick, { to, quality, instrument, tritone }));
			}
		}
	} catch (e) {
		if (e instanceof VariantRequestError) return { ok: false, error: { message: e.message } };
		throw e;
	}
	return { ok: true, variants };
}
