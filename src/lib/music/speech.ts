/**
 * Sentences about a variant. A warning worked out once for a lick in its own key (re-mapping
 * runs there) must still speak of the variant on screen: its chord names and its note names, in
 * the written or concert pitch the learner reads. Such a warning carries a template whose names
 * are marked; each variant fills them in, and the plain message reads them as written.
 *
 * Marks: `⟦k|Cmaj7⟧` a chord symbol, `⟦s3|F#4⟧` the source pitch of note 3 (before re-mapping),
 * `⟦o3|F4⟧` the pitch note 3 sounds in the variant.
 */
import type { MusicWarning } from './types';

/** How a variant names what a template marks. */
export interface Speaker {
	chord(symbol: string): string;
	source(note: number, pitch: string): string;
	output(note: number, pitch: string): string;
}

const MARK = /⟦([kso])(\d*)\|([^⟧]*)⟧/g;

/**
 * Mark a chord symbol in a template.
 * @example chordMark('Cmaj7') // '⟦k|Cmaj7⟧'
 */
export const chordMark = (symbol: string): string => `⟦k|${symbol}⟧`;

/**
 * Mark the source pitch of a note (as written before re-mapping).
 * @example sourceMark(3, 'F#4') // '⟦s3|F#4⟧'
 */
export const sourceMark = (note: number, pitch: string): string => `⟦s${note}|${pitch}⟧`;

/**
 * Mark the pitch a note sounds in the variant.
 * @example outputMark(3, 'F4') // '⟦o3|F4⟧'
 */
export const outputMark = (note: number, pitch: string): string => `⟦o${note}|${pitch}⟧`;

/**
 * A template read as written (the lick in its own key, at concert pitch).
 * @example plainText('over ⟦k|C7⟧') // 'over C7'
 */
export function plainText(template: string): string {
	return template.replace(MARK, (_, _kind, _n, text: string) => text);
}

/** A template cut once into literal text and marks: a grid speaks each one per variant. */
type Part = string | { kind: string; n: number; text: string };
const compiled = new Map<string, readonly Part[]>();

function partsOf(template: string): readonly Part[] {
	let parts = compiled.get(template);
	if (parts) return parts;
	const out: Part[] = [];
	let last = 0;
	for (const m of template.matchAll(MARK)) {
		if (m.index > last) out.push(template.slice(last, m.index));
		out.push({ kind: m[1], n: Number(m[2]), text: m[3] });
		last = m.index + m[0].length;
	}
	if (last < template.length) out.push(template.slice(last));
	parts = out;
	// Templates come from a lick's own notes and chords: bound the cache for a long-lived server.
	if (compiled.size > 5000) compiled.clear();
	compiled.set(template, parts);
	return parts;
}

/**
 * A template spoken for one variant.
 * @example speakText('over ⟦k|C7⟧', speaker) // 'over D7' for the variant in D
 */
export function speakText(template: string, speaker: Speaker): string {
	let out = '';
	for (const part of partsOf(template)) {
		if (typeof part === 'string') out += part;
		else if (part.kind === 'k') out += speaker.chord(part.text);
		else if (part.kind === 's') out += speaker.source(part.n, part.text);
		else out += speaker.output(part.n, part.text);
	}
	return out;
}

/**
 * Warnings with their templates spoken for a variant; the template itself is not sent on.
 * @example speakWarnings([{ code: 'x', message: 'over C7', template: 'over ⟦k|C7⟧' }], speaker)
 */
export function speakWarnings(list: readonly MusicWarning[], speaker: Speaker): MusicWarning[] {
	const out: MusicWarning[] = new Array(list.length);
	for (let i = 0; i < list.length; i++) {
		const w = list[i];
		if (w.template === undefined) {
			out[i] = w;
			continue;
		}
		const { template, ...rest } = w;
		out[i] = { ...rest, message: speakText(template, speaker) };
	}
	return out;
}
