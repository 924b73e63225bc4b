/**
 * Preparing a lick: parse its abc once (with any hand-written versions), read its chord symbols
 * and own quality, and hold the caches every variant of it shares.
 */
import { parseAbc, type ParsedAbc } from './abc/parse';
import type { AbcError } from './abc/tokenize';
import { parseChordSymbol } from './chord-symbol';
import { chordShape } from './chord-shape';
import { degreeRows } from './degrees';
import { beatsPerBar } from './meter';
import { isQualityId } from './qualities';
import { type KeySignature } from './keys';
import { parseNoteName, type SpelledNote } from './pitch';
import { type KeyPlan } from './transpose';
import { QUALITY_IDS, type ChordContext, type QualityId } from './types';
import type { QualityLayer } from './layer';

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
	/** Beats of a count-in bar for the lick's meter, read once. */
	beatsPerBar: number;
}

/** Hand-written versions of a lick, by the quality each is written over (abc text each). */
export type HandWrittenVersions = Partial<Record<QualityId, string>>;

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
	const contexts = tune.chordSymbols.map((c) => c.context);
	const shapes = contexts.map((c) => c && chordShape(c));
	const own: QualityLayer = {
		quality,
		pitches: tune.heads.map((h) => h.pitch),
		chordTexts: tune.chordSymbols.map((c) => c.text),
		contexts,
		shapes,
		degrees: degreeRows(shapes, contexts),
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
			versions: new Map(),
			beatsPerBar: beatsPerBar(tune.meter)
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
