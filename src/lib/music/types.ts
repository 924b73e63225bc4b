/**
 * Shared vocabulary of the music engine. Every module under `src/lib/music` speaks these types;
 * the abc reader/writer produces and consumes them, harmony modules (degrees, re-mapping,
 * analysis, instruments) work on them without knowing abc.
 */

/** A pitch class spelled with letter and accidentals, tonal style: `C`, `F#`, `Bb`, `Ebb`. */
export type NoteName = string;

/** A spelled pitch with octave in scientific notation (C4 = middle C = MIDI 60): `F#4`, `Bb3`. */
export type PitchName = string;

/** A key tonic as the user names it: one of the twelve jazz spellings, `Eb`, `F#`, `Gb`, ... */
export type KeyName = NoteName;

/** The chord qualities a lick can be re-mapped over. */
export const QUALITY_IDS = ['7', 'm7', 'maj7', 'm7b5', '7alt', 'dim7', '6', 'm6', '7sus4'] as const;
export type QualityId = (typeof QUALITY_IDS)[number];

/** A chord in force, parsed from a chord symbol such as `"Bb7#11/D"`. */
export interface ChordContext {
	/** The chord symbol as written in the abc (without quotes). */
	symbol: string;
	root: NoteName;
	/** The quality the symbol reduces to, or null when it reduces to none we know. */
	quality: QualityId | null;
	/** Bass note of a slash chord, else null. */
	bass: NoteName | null;
}

/** One sounding note of a lick, in playing order (tied continuations merged into the first). */
export interface SoundingNote {
	/** Position among the lick's note heads that start a sound (0-based). */
	index: number;
	pitch: PitchName;
	midi: number;
	/** Onset in whole notes from the start of the tune (a quarter note is 0.25). */
	start: number;
	/** Length in whole notes, ties included. */
	duration: number;
	/** The chord symbol in force at the onset, or null before the first one. */
	chord: ChordContext | null;
}

/** A non-fatal remark the engine returns with a result. */
export interface MusicWarning {
	code: string;
	/** A sentence a teacher understands. */
	message: string;
	/** Note indices concerned, when any. */
	notes?: number[];
	/**
	 * The message with its chord and note names marked (`speech.ts`), so that each variant can
	 * speak of its own names; the engine fills it in and never sends it on.
	 */
	template?: string;
}
