/**
 * Written pitch and octave choice per instrument. Transposing to written pitch is by interval, so
 * letters stay right (concert Eb4 on alto saxophone is written C5, not B#4).
 */
import {
	INSTRUMENT_IDS,
	INSTRUMENT_ROWS,
	type InstrumentId,
	type InstrumentRow
} from './instruments-data';
import { MAJOR_KEY_SPELLINGS } from './key-data';
import { formatPitch, mod12, MusicInvariantError, parsePitchName, transposePitch } from './pitch';

/** Note names for messages: the jazz key spellings, with the sharp side's C♯ and F♯ for pitches. */
const MIDI_NAMES = MAJOR_KEY_SPELLINGS.map((k, pc) => (pc === 1 ? 'C#' : pc === 6 ? 'F#' : k));
import { parseInterval } from './qualities';
import type { MusicWarning, PitchName } from './types';

export { INSTRUMENT_IDS, INSTRUMENT_ROWS } from './instruments-data';
export type { ClefName, InstrumentId, InstrumentRow } from './instruments-data';

/** An instrument row with its transposition as numbers. */
export interface Instrument extends InstrumentRow {
	/** Written = concert + this many semitones. */
	semitones: number;
	/** Written = concert + this many letter steps. */
	steps: number;
}

const INSTRUMENTS = new Map<InstrumentId, Instrument>(
	INSTRUMENT_ROWS.map((row) => {
		const iv = parseInterval(row.written);
		return [row.id, { ...row, semitones: iv.semitones, steps: iv.steps }];
	})
);

/**
 * Whether a string names an instrument of the table.
 * @example isInstrumentId('alto-sax') // true
 */
export function isInstrumentId(value: unknown): value is InstrumentId {
	return typeof value === 'string' && (INSTRUMENT_IDS as readonly string[]).includes(value);
}

/**
 * An instrument by id; an unknown id is a caller's bug (validate input with `isInstrumentId`).
 * @example getInstrument('tenor-sax').semitones // 14
 */
export function getInstrument(id: InstrumentId): Instrument {
	const instrument = INSTRUMENTS.get(id);
	if (!instrument) throw new MusicInvariantError(`Unknown instrument '${id}'`);
	return instrument;
}

/**
 * The written pitch of a concert pitch, shifted by whole octaves when asked.
 * @example writtenPitch('C4', 'alto-sax') // 'A4'
 */
export function writtenPitch(concert: PitchName, id: InstrumentId, octaveShift = 0): PitchName {
	const p = parsePitchName(concert);
	if (!p) throw new MusicInvariantError(`Not a pitch name: '${concert}'`);
	const i = getInstrument(id);
	return formatPitch(
		transposePitch(p, {
			steps: i.steps + 7 * octaveShift,
			semitones: i.semitones + 12 * octaveShift
		})
	);
}

/** Scientific name of a MIDI number in the usual jazz spelling, for messages. */
function midiName(midi: number): string {
	return MIDI_NAMES[mod12(midi)] + (Math.floor(midi / 12) - 1);
}

export interface RangeFit {
	/** Octaves to add to the written line (negative: down). */
	octaveShift: number;
	warnings: MusicWarning[];
}

/**
 * The octave shift that puts a line inside an instrument's written range. A lick sounds where it
 * was written unless the range forces a move: among the shifts that leave the fewest notes
 * outside, the smallest, then the one whose middle lies nearest the middle of the range. A move
 * comes with a warning that says so; when no shift fits, the warning names the notes outside.
 * @example fitToRange([48, 50, 52], 'trumpet') // { octaveShift: 1, warnings: [] }
 */
export function fitToRange(concertMidis: readonly number[], id: InstrumentId): RangeFit {
	const instrument = getInstrument(id);
	if (concertMidis.length === 0) return { octaveShift: 0, warnings: [] };
	const written = concertMidis.map((m) => m + instrument.semitones);
	const low = Math.min(...written);
	const high = Math.max(...written);
	const rangeMiddle = (instrument.low + instrument.high) / 2;
	let best: { shift: number; outside: number; distance: number } | null = null;
	for (let shift = -4; shift <= 4; shift++) {
		const lo = low + 12 * shift;
		const hi = high + 12 * shift;
		const outside = written.filter(
			(m) => m + 12 * shift < instrument.low || m + 12 * shift > instrument.high
		).length;
		const distance = Math.abs((lo + hi) / 2 - rangeMiddle);
		const better =
			!best ||
			outside < best.outside ||
			(outside === best.outside && Math.abs(shift) < Math.abs(best.shift)) ||
			(outside === best.outside &&
				Math.abs(shift) === Math.abs(best.shift) &&
				distance < best.distance);
		if (better) best = { shift, outside, distance };
	}
	const { shift } = best!;
	const range = `${midiName(instrument.low)}–${midiName(instrument.high)}`;
	const name = instrument.label
		.replace(/ \(.*\)$/, '')
		.replace(/^(\w)(?!-)/, (c) => c.toLowerCase());
	if (best!.outside === 0) {
		if (shift === 0) return { octaveShift: 0, warnings: [] };
		const by = Math.abs(shift) === 1 ? 'an octave' : `${Math.abs(shift)} octaves`;
		return {
			octaveShift: shift,
			warnings: [
				{
					code: 'octave-moved',
					message: `Played ${by} ${shift > 0 ? 'higher' : 'lower'} than the lick is written, to fit the ${name}'s written range ${range}.`
				}
			]
		};
	}
	const outsideIdx = written
		.map((m, i) => [m + 12 * shift, i] as const)
		.filter(([m]) => m < instrument.low || m > instrument.high);
	const span = high - low;
	const room = instrument.high - instrument.low;
	const why =
		span > room
			? `The line spans ${span} semitones, more than the ${room} of the ${name}'s written range ${range}`
			: `No octave puts the whole line inside the ${name}'s written range ${range}`;
	return {
		octaveShift: shift,
		warnings: [
			{
				code: 'out-of-range',
				message: `${why}: written ${outsideIdx.map(([m]) => midiName(m)).join(', ')} ${outsideIdx.length === 1 ? 'lies' : 'lie'} outside it.`,
				notes: outsideIdx.map(([, i]) => i)
			}
		]
	};
}
