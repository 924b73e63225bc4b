/**
 * The music engine's facade: abc in, a variant out (key, chord quality, instrument), or the whole
 * grid of variants from one parse. Parsing happens once per lick; each variant is a walk over the
 * parsed note heads with small integer arithmetic and one pass of the emitter.
 */
import { emitAbc, transposeChordSymbol } from './abc/emit';
import { parseAbc, type ParsedAbc } from './abc/parse';
import type { AbcError } from './abc/tokenize';
import { parseChordSymbol } from './chord-symbol';
import { degreeAt, type DegreeLabel } from './degrees';
import { formatKeyField, type KeySignature, type TritoneSpelling } from './keys';
import {
	chromaOf,
	formatNoteName,
	formatPitch,
	midiOf,
	parseNoteName,
	transposePitch,
	type SpelledNote,
	type SpelledPitch,
	type Steps
} from './pitch';
import { simplifySpelling } from './spelling';
import { planKeys, shiftPlan, type KeyPlan } from './transpose';
import type { ChordContext, KeyName, MusicWarning, PitchName, QualityId } from './types';

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
	chord: ChordContext | null;
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
}

export interface VariantSuccess {
	ok: true;
	/** The abc written for the instrument (concert pitch without one). */
	abc: string;
	/** Concert key tonic of the variant, e.g. `Eb`. */
	key: KeyName;
	/** The K: value written in the output (for a transposing instrument, the written key). */
	writtenKey: string;
	quality: QualityId | null;
	instrument: string;
	warnings: MusicWarning[];
	notes: VariantNote[];
}

export type VariantResult = VariantSuccess | { ok: false; error: AbcError };

/** A lick parsed once, ready for any number of variants. */
export interface PreparedLick {
	tune: ParsedAbc;
	/** The lick's own chord quality: that of its first chord symbol, or null. */
	quality: QualityId | null;
}

export type PrepareResult = { ok: true; lick: PreparedLick } | { ok: false; error: AbcError };

/** Errors in the request rather than in the abc; the message names the bad value. */
export class VariantRequestError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'VariantRequestError';
	}
}

const readChord = (symbol: string): ChordContext | null => {
	const parsed = parseChordSymbol(symbol);
	return parsed && { symbol: parsed.symbol, root: parsed.root, quality: parsed.quality, bass: parsed.bass };
};

/**
 * Parse a lick once.
 * @example prepareLick('X:1\nK:C\n"C7"CEGB|').lick.quality // '7'
 */
export function prepareLick(abc: string): PrepareResult {
	const parsed = parseAbc(abc, readChord);
	if (!parsed.ok) return parsed;
	const first = parsed.tune.chordSymbols.find((c) => c.context !== null);
	return { ok: true, lick: { tune: parsed.tune, quality: first?.context?.quality ?? null } };
}

/**
 * Read a target key name; throws a request error naming the bad value.
 * @example readKeyName('Eb') // { letter: 2, alt: -1 }
 */
export function readKeyName(name: string): SpelledNote {
	const n = parseNoteName(name);
	if (!n || Math.abs(n.alt) > 1) {
		throw new VariantRequestError(
			`“${name}” is not a key: name a tonic such as C, Eb or F# (one sharp or flat at most).`
		);
	}
	return n;
}

/** Chord contexts and symbol texts of a tune after moving by an interval. */
function moveChords(
	tune: ParsedAbc,
	by: Steps,
	keys: readonly KeySignature[]
): { texts: string[]; contexts: (ChordContext | null)[] } {
	const texts: string[] = [];
	const contexts: (ChordContext | null)[] = [];
	let keyIndex = 0;
	for (const cs of tune.chordSymbols) {
		while (keyIndex + 1 < tune.keys.length && tune.keys[keyIndex + 1].token < cs.token) keyIndex++;
		const original = tune.tokens[cs.token].value as string;
		const text = cs.context ? transposeChordSymbol(original, by, keys[keyIndex].accidentals) : original;
		texts.push(text);
		contexts.push(cs.context && readChord(text));
	}
	return { texts, contexts };
}

/** Pitches of every head moved by an interval and spelled for the key in force. */
function movePitches(tune: ParsedAbc, by: Steps, keys: readonly KeySignature[]): SpelledPitch[] {
	const out: SpelledPitch[] = new Array(tune.heads.length);
	for (let i = 0; i < tune.heads.length; i++) {
		const h = tune.heads[i];
		out[i] = simplifySpelling(transposePitch(h.pitch, by), keys[h.key].accidentals);
	}
	return out;
}

/**
 * One variant of a prepared lick.
 * @example renderVariant(lick, { to: 'Eb' }).key // 'Eb'
 */
export function renderVariant(lick: PreparedLick, options: VariantOptions = {}): VariantResult {
	const { tune } = lick;
	const tritone = options.tritone ?? 'Gb';
	const target = options.to === undefined ? null : readKeyName(options.to);
	const originalKeys = tune.keys.map((k) => k.key);
	const concert: KeyPlan = planKeys(originalKeys, target, { tritone, octaves: options.octaves });
	const warnings: MusicWarning[] = [...tune.warnings, ...concert.warnings];
	const quality = options.quality ?? lick.quality;
	const instrument = options.instrument ?? 'concert';

	const concertPitches = movePitches(tune, concert.interval, concert.keys);
	const concertChords = moveChords(tune, concert.interval, concert.keys);
	const written: KeyPlan = shiftPlan(originalKeys, concert, { steps: 0, semitones: 0 }, tritone);
	const writtenPitches = written === concert ? concertPitches : movePitches(tune, written.interval, written.keys);
	const writtenChords = written === concert ? concertChords : moveChords(tune, written.interval, written.keys);

	const abc = emitAbc(tune, { keys: written.keys, pitches: writtenPitches, chordSymbols: writtenChords.texts });
	const notes: VariantNote[] = tune.notes.map((n) => ({ ...n, degree: null }));
	for (let i = 0; i < tune.heads.length; i++) {
		const h = tune.heads[i];
		if (h.grace || h.continuation) continue;
		const p = concertPitches[i];
		const note = notes[h.sounding];
		note.pitch = formatPitch(p);
		note.midi = midiOf(p);
	}
	// Chord contexts follow the chord symbols in order: the n-th symbol's context replaces the
	// original one wherever that was in force.
	const contextOf = new Map<ChordContext, ChordContext | null>();
	tune.chordSymbols.forEach((cs, i) => cs.context && contextOf.set(cs.context, concertChords.contexts[i]));
	for (const note of notes) {
		if (!note.chord) continue;
		const chord = contextOf.get(note.chord) ?? null;
		note.chord = chord;
		note.degree = chord ? degreeAt(note.midi - chromaOf(parseNoteName(chord.root) as SpelledNote), chord.quality).label : null;
	}
	const firstKey = concert.keys[0];
	return {
		ok: true,
		abc,
		key: firstKey.none ? 'C' : formatNoteName(firstKey.tonic),
		writtenKey: formatKeyField(written.keys[0]),
		quality,
		instrument,
		warnings,
		notes
	};
}

/**
 * Parse and render one variant; errors in the abc come back positioned, errors in the request
 * (an unknown key, quality or instrument) as a message.
 * @example computeVariant({ abc: 'X:1\nK:Bb\n"Bb7"B2|', to: 'C' }).abc // 'X:1\nK:C\n"C7"c2|'
 */
export function computeVariant(
	request: { abc: string } & VariantOptions
): VariantResult | { ok: false; error: { message: string; line?: number; column?: number } } {
	const prepared = prepareLick(request.abc);
	if (!prepared.ok) return prepared;
	try {
		return renderVariant(prepared.lick, request);
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
	tritone: TritoneSpelling = 'Gb'
): GridResult | { ok: false; error: { message: string; line?: number; column?: number } } {
	const prepared = prepareLick(abc);
	if (!prepared.ok) return prepared;
	const variants: VariantSuccess[] = [];
	try {
		for (const to of keys) {
			for (const quality of qualities) {
				const v = renderVariant(prepared.lick, { to, quality, instrument, tritone });
				if (v.ok) variants.push(v);
			}
		}
	} catch (e) {
		if (e instanceof VariantRequestError) return { ok: false, error: { message: e.message } };
		throw e;
	}
	return { ok: true, variants };
}
