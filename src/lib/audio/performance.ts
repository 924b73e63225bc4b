/**
 * Turns the sounding notes of a lick into a timed performance for the browser player: swung
 * eighths, a one-bar count-in and the chords voiced under the line. Pure (no audio, no clock) so
 * that the timing can be tested; `Player.svelte` hands the events to Tone.js.
 */
import { Note } from 'tonal';
import { chordToneIntervals, parseChordSymbol } from '../music/chord-symbol';

/** Root, slash bass and chord tones of a symbol, through the engine's one chord-symbol reader. */
function readChordSymbol(
	symbol: string
): { tonic: string; bass: string | null; intervals: readonly string[] } | null {
	const parsed = parseChordSymbol(symbol);
	if (!parsed) return null;
	const intervals = chordToneIntervals(parsed.suffix);
	if (intervals.length === 0) return null;
	return { tonic: parsed.root, bass: parsed.bass, intervals };
}

/** The part of a sounding note the player needs (the transpose route's `notes[]`). */
export interface PerformanceNote {
	midi: number;
	/** Onset in whole notes from the start of the tune. */
	start: number;
	/** Length in whole notes. */
	duration: number;
	/** The chord symbol in force, e.g. `Dm7`, or null. */
	chord: string | null;
}

export interface PerformanceOptions {
	/** Quarter-note beats per minute. */
	bpm: number;
	/** Long-to-short ratio of a pair of eighths; 1 is straight, 2 the triplet feel. */
	swingRatio: number;
	/** Beats in the count-in bar; 0 for none. */
	countInBeats: number;
	/** Quarter-note beats in one bar of the tune (4 in 4/4, 3 in 6/8); 4 when absent. */
	barBeats?: number;
}

export interface PerformanceEvent {
	part: 'melody' | 'chord' | 'click';
	/** MIDI numbers sounding together. */
	midi: number[];
	/** Seconds from the start of playback. */
	time: number;
	/** Seconds. */
	duration: number;
	/** The first click of the count-in is accented. */
	accent?: boolean;
}

export interface Performance {
	events: PerformanceEvent[];
	/** Seconds until the last sound ends. */
	totalSeconds: number;
	/** Seconds of count-in before the tune starts. */
	countInSeconds: number;
	/**
	 * Seconds from one pass of the tune to the next when it is looped: its length rounded up to
	 * whole bars, so the next pass starts on a downbeat.
	 */
	loopSeconds: number;
}

export class PerformanceError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'PerformanceError';
	}
}

/**
 * Where a straight position (in beats) falls once eighths are swung: the first half of each beat
 * stretches to r/(1+r) of it, the second half shrinks to 1/(1+r) (common practice: long =
 * beat·r/(1+r), short = beat/(1+r)). Positions on the beat do not move.
 * @example swingBeats(0.5, 2) // 0.6667: the off-beat eighth comes late
 */
export function swingBeats(beats: number, ratio: number): number {
	if (!(ratio > 0) || !Number.isFinite(ratio)) {
		throw new PerformanceError(`Swing ratio must be a positive number, got ${ratio}.`);
	}
	const whole = Math.floor(beats);
	const f = beats - whole;
	const long = ratio / (1 + ratio);
	const swung = f <= 0.5 ? f * 2 * long : long + (f - 0.5) * 2 * (1 - long);
	return whole + swung;
}

/**
 * A shell voicing for a chord symbol: the root (or slash bass) low, then the third and seventh
 * (sixth for 6 chords, fourth for sus) above it, the way a pianist's left hand sketches changes.
 * Empty for a symbol that names no chord.
 * @example shellVoicing('Dm7') // [38, 53, 60]: D2, F3, C4
 */
export function shellVoicing(symbol: string): number[] {
	const chord = readChordSymbol(symbol);
	if (!chord) return [];
	const bass = Note.midi(`${chord.bass ?? chord.tonic}2`);
	if (bass == null) return [];
	const guide = (prefixes: string[]) => chord.intervals.find((i) => prefixes.includes(i[0]));
	const third = guide(['3', '4']);
	const seventh = guide(['7', '6']);
	const upper = [third, seventh]
		.filter((i): i is string => Boolean(i))
		.map((i) => {
			// Keep the guide tones between E3 and E4 (52..64), clear of the melody and the bass.
			let n = Note.midi(Note.transpose(`${chord.tonic}2`, i)) ?? bass;
			while (n < 52) n += 12;
			while (n > 64) n -= 12;
			return n;
		});
	return [bass, ...upper];
}

/**
 * The timed events of a performance: count-in clicks, then the melody and its chords, all swung.
 * @example buildPerformance([{ midi: 60, start: 0, duration: 0.125, chord: 'C7' }], { bpm: 120, swingRatio: 2, countInBeats: 4 }).totalSeconds // 2.333
 */
export function buildPerformance(
	notes: readonly PerformanceNote[],
	options: PerformanceOptions
): Performance {
	const { bpm, swingRatio, countInBeats } = options;
	checkOptions(options);
	const beat = 60 / bpm;
	const offset = countInBeats * beat;
	// Whole notes → beats (a quarter note is one beat) → swung seconds after the count-in.
	const at = (wholes: number) => offset + swingBeats(wholes * 4, swingRatio) * beat;

	const events: PerformanceEvent[] = [];
	for (let i = 0; i < countInBeats; i++) {
		events.push({
			part: 'click',
			midi: [i === 0 ? 84 : 79],
			time: i * beat,
			duration: 0.06,
			accent: i === 0
		});
	}

	let chordStart = 0;
	let chordSymbol: string | null = null;
	let end = 0;
	const closeChord = (until: number) => {
		if (chordSymbol == null || until <= chordStart) return;
		const voicing = shellVoicing(chordSymbol);
		if (voicing.length === 0) return;
		const time = at(chordStart);
		events.push({ part: 'chord', midi: voicing, time, duration: at(until) - time });
	};

	for (const note of notes) {
		if (!(note.duration > 0) || !(note.start >= 0)) {
			throw new PerformanceError(
				`A note needs a start of 0 or more and a positive length, got start ${note.start}, length ${note.duration}.`
			);
		}
		if (note.chord !== chordSymbol) {
			closeChord(note.start);
			chordSymbol = note.chord;
			chordStart = note.start;
		}
		const time = at(note.start);
		const stop = at(note.start + note.duration);
		events.push({ part: 'melody', midi: [note.midi], time, duration: stop - time });
		end = Math.max(end, note.start + note.duration);
	}
	closeChord(end);

	events.sort((a, b) => a.time - b.time);
	const totalSeconds = events.reduce((t, e) => Math.max(t, e.time + e.duration), 0);
	return { events, totalSeconds, ...loopOf(end, options) };
}

function checkOptions({ bpm, countInBeats, barBeats = 4 }: PerformanceOptions): void {
	if (!(bpm >= 20 && bpm <= 400)) {
		throw new PerformanceError(`Tempo must be between 20 and 400 bpm, got ${bpm}.`);
	}
	if (!Number.isInteger(countInBeats) || countInBeats < 0 || countInBeats > 12) {
		throw new PerformanceError(`Count-in must be 0 to 12 beats, got ${countInBeats}.`);
	}
	if (!(barBeats > 0 && barBeats <= 16)) {
		throw new PerformanceError(`A bar must hold 1 to 16 beats, got ${barBeats}.`);
	}
}

/** Count-in length and the bar-rounded length of one pass, for a tune `wholes` long. */
function loopOf(
	wholes: number,
	{ bpm, countInBeats, barBeats = 4 }: PerformanceOptions
): Pick<Performance, 'countInSeconds' | 'loopSeconds'> {
	const beat = 60 / bpm;
	// A float sum of note lengths may overshoot a barline by a hair: do not add a bar for it.
	const bars = Math.max(1, Math.ceil((wholes * 4) / barBeats - 1e-9));
	return { countInSeconds: countInBeats * beat, loopSeconds: bars * barBeats * beat };
}

/**
 * Semitones from the bass to the chord's fifth (diminished in m7b5, raised in aug); 0 over a
 * slash bass, which the bass holds instead of walking to a fifth of some other note.
 */
function fifthAbove(symbol: string): number {
	const chord = readChordSymbol(symbol);
	if (!chord || chord.bass) return 0;
	const fifth = chord.intervals.find((i) => i.startsWith('5'));
	return { '5d': 6, '5A': 8 }[fifth ?? ''] ?? 7;
}

/** One chord of the changes: its symbol and where it starts and how long it lasts, in wholes. */
export interface ChordSpan {
	symbol: string;
	start: number;
	duration: number;
}

/**
 * The changes under a line: each chord from the first note it sounds under until the next chord,
 * the first one from the top of the tune and the last one to the end of its bar.
 * @example chordSpans([{ midi: 60, start: 0, duration: 0.5, chord: 'Dm7' }, { midi: 62, start: 0.5, duration: 0.25, chord: 'G7' }]) // [{symbol:'Dm7',start:0,duration:0.5},{symbol:'G7',start:0.5,duration:0.5}]
 */
export function chordSpans(notes: readonly PerformanceNote[], barBeats = 4): ChordSpan[] {
	const spans: ChordSpan[] = [];
	let end = 0;
	for (const note of notes) {
		end = Math.max(end, note.start + note.duration);
		if (note.chord == null || shellVoicing(note.chord).length === 0) continue;
		const last = spans.at(-1);
		if (last?.symbol === note.chord) continue;
		spans.push({ symbol: note.chord, start: spans.length === 0 ? 0 : note.start, duration: 0 });
	}
	const bar = barBeats / 4;
	const tuneEnd = Math.max(bar, Math.ceil(end / bar - 1e-9) * bar);
	spans.forEach((span, i) => {
		const next = spans[i + 1]?.start ?? tuneEnd;
		span.duration = next - span.start;
	});
	return spans.filter((s) => s.duration > 0);
}

/**
 * The changes alone, for playing a line over from memory: a count-in, then a bass note on every
 * other beat (root, then fifth while the chord lasts), and the chord's guide tones comped on the
 * downbeat and on the off-beat of beat 2 of each bar (a common comping figure), and again wherever
 * the chord changes. Swung like the line would be.
 * @example buildChangesPerformance([{ symbol: 'C7', start: 0, duration: 1 }], { bpm: 120, swingRatio: 2, countInBeats: 4 }).loopSeconds // 2
 */
export function buildChangesPerformance(
	spans: readonly ChordSpan[],
	options: PerformanceOptions
): Performance {
	const { bpm, swingRatio, countInBeats, barBeats = 4 } = options;
	checkOptions(options);
	const beat = 60 / bpm;
	const offset = countInBeats * beat;
	const at = (beats: number) => offset + swingBeats(beats, swingRatio) * beat;
	const events: PerformanceEvent[] = [];
	for (let i = 0; i < countInBeats; i++) {
		events.push({
			part: 'click',
			midi: [i === 0 ? 84 : 79],
			time: i * beat,
			duration: 0.06,
			accent: i === 0
		});
	}
	let end = 0;
	for (const span of spans) {
		if (!(span.duration > 0) || !(span.start >= 0)) {
			throw new PerformanceError(
				`A chord needs a start of 0 or more and a positive length, got start ${span.start}, length ${span.duration}.`
			);
		}
		const voicing = shellVoicing(span.symbol);
		if (voicing.length === 0) continue;
		const [bass, ...guides] = voicing;
		const fifth = bass + fifthAbove(span.symbol);
		const from = span.start * 4;
		const to = (span.start + span.duration) * 4;
		end = Math.max(end, span.start + span.duration);
		// Bass: two-beat notes from the chord's start, root then fifth.
		for (let b = from, n = 0; b < to - 1e-9; b += 2, n++) {
			const stop = Math.min(b + 2, to);
			const time = at(b);
			events.push({
				part: 'chord',
				midi: [n % 2 === 0 ? bass : fifth],
				time,
				duration: at(stop) - time
			});
		}
		// Comping: on the change itself, then on each bar's 1 and the "and" of 2.
		const hits = new Set<number>([from]);
		for (let bar = Math.floor(from / barBeats) * barBeats; bar < to; bar += barBeats) {
			for (const h of [bar, bar + 1.5]) if (h >= from && h < to - 1e-9) hits.add(h);
		}
		for (const h of [...hits].sort((a, b) => a - b)) {
			const stop = Math.min(h + 1, to);
			const time = at(h);
			events.push({ part: 'chord', midi: guides, time, duration: at(stop) - time });
		}
	}
	events.sort((a, b) => a.time - b.time);
	const totalSeconds = events.reduce((t, e) => Math.max(t, e.time + e.duration), 0);
	return { events, totalSeconds, ...loopOf(end, options) };
}
