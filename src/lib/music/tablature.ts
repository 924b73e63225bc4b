/**
 * Guitar tablature: standard tuning and the settings that make abcjs draw frets that sound what
 * the learner hears.
 *
 * Written guitar music sounds an octave below the staff (common practice; abc 2.1 §4.6 writes
 * that as `clef=treble-8`, and the engine's guitar parts carry it). abcjs 6.7.2 reads such a
 * clef by moving each note down an octave before finding its fret, then compares it with its
 * default tuning, which is given in *written* pitch (`E,` = E3): the two shifts together put
 * every fret an octave too low (a written D5 came out as the open D string). Giving abcjs the
 * tuning at sounding pitch instead makes both sides speak of what sounds.
 */

/** Open strings of a guitar in standard tuning, low to high, as MIDI numbers: E2 A2 D3 G3 B3 E4. */
export const GUITAR_OPEN_STRINGS: readonly number[] = [40, 45, 50, 55, 59, 64];

/** The highest fret we expect on a single-line part (22-fret neck). */
export const GUITAR_FRETS = 22;

/**
 * The sounding MIDI number of a fret on a string (0 = low E) in standard tuning.
 * @example fretPitch(1, 3) // 48 (C3: third fret on the A string)
 */
export function fretPitch(string: number, fret: number): number {
	return GUITAR_OPEN_STRINGS[string] + fret;
}

/**
 * abcjs `tablature` settings for a guitar part written with `clef=treble-8`: the open strings at
 * sounding pitch in abc (E,, = E2 … E = E4) and the top of the neck (fret 22 on the high E: D6).
 */
export const GUITAR_TABLATURE = {
	instrument: 'guitar',
	label: 'Guitar',
	tuning: ['E,,', 'A,,', 'D,', 'G,', 'B,', 'E'],
	highestNote: "d'"
} as const;
