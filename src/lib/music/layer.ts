/**
 * The quality layer: a prepared lick re-mapped over another chord quality, still in its own key,
 * computed once per quality and cached on the lick.
 */
import { formatChordSymbol } from './chord-symbol';
import { chordShape, type ChordShape } from './chord-shape';
import { degreeRows, type Degree } from './degrees';
import { remapNotes } from './remap';
import { isQualityId } from './qualities';
import {
	chromaOf,
	midiOf,
	MusicInvariantError,
	parseNoteName,
	parsePitchName,
	transposePitch,
	type SpelledNote,
	type SpelledPitch,
	type Steps
} from './pitch';
import { QUALITY_IDS, type ChordContext, type MusicWarning, type QualityId } from './types';
import type { PreparedLick } from './prepare';
import { VariantRequestError } from './prepare';

/** The lick over one chord quality, still in its own key. */
export interface QualityLayer {
	quality: QualityId | null;
	/** A pitch per note head. */
	pitches: SpelledPitch[];
	/** Chord symbol texts (without quotes) and contexts, one per chord symbol of the tune. */
	chordTexts: string[];
	contexts: (ChordContext | null)[];
	/** What each pitch class is over each chord symbol (degree, role, letter), or null. */
	shapes: (ChordShape | null)[];
	/** The twelve degrees over each chord symbol (by semitones above its root), or null. */
	degrees: (readonly Degree[] | null)[];
	warnings: MusicWarning[];
}

/** The lick re-mapped over another quality (harmony's `remapNotes`), cached on the lick. */
export function layerFor(lick: PreparedLick, quality: QualityId | null): QualityLayer {
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
	const layer = {
		quality,
		pitches,
		chordTexts,
		contexts,
		shapes,
		degrees: degreeRows(shapes, contexts),
		warnings: remapped.warnings
	};
	lick.layers.set(quality, layer);
	return layer;
}
