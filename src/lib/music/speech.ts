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

/**
 * A template spoken for one variant.
 * @example speakText('over ⟦k|C7⟧', speaker) // 'over D7' for the variant in D
 */
export function speakText(template: string, speaker: Speaker): string {
	return template.replace(MARK, (_, kind: string, n: string, text: string) =>
		kind === 'k'
			? speaker.chord(text)
			: kind === 's'
				? speaker.source(Number(n), text)
				: speaker.output(Number(n), text)
	);
}

/**
 * Warnings with their templates spoken for a variant; the template itself is not sent on.
 * @example speakWarnings([{ code: 'x', message: 'over C7', template: 'over ⟦k|C7⟧' }], speaker)
 */
export function speakWarnings(list: readonly MusicWarning[], speaker: Speaker): MusicWarning[] {
	return list.map((w) => {
		if (w.template === undefined) return w;
		const { template, ...rest } = w;
		return { ...rest, message: speakText(template, speaker) };
	});
}
