/**
 * Screen words for the library's stored values: chord qualities, visibility and feel. One place,
 * so the table, the editor, the print sheet and the share page say the same thing.
 */
import { QUALITY_LABELS as ENGINE_QUALITY_LABELS, QUALITY_SYMBOLS } from '../music/qualities-data';
/** The engine's one list of qualities, in the words a picker shows. */
export const QUALITY_LABELS: Readonly<Record<string, string>> = ENGINE_QUALITY_LABELS;

/** Short form for a table cell. */
export const QUALITY_SHORT: Readonly<Record<string, string>> = QUALITY_SYMBOLS;

export const VISIBILITY_LABELS: Record<string, string> = {
	private: 'Only me',
	classes: 'My classes',
	public: 'Anyone with the link'
};

/**
 * A swing ratio in words.
 * @example feelLabel(1) // 'Straight'
 */
export function feelLabel(ratio: number): string {
	if (ratio <= 1) return 'Straight';
	return `Swing ${Number(ratio.toFixed(2))}:1`;
}

/** Feels offered by the editor (ratio of paired eighths). */
export const FEELS = [
	{ value: 1, label: 'Straight eighths' },
	{ value: 1.5, label: 'Light swing (3:2)' },
	{ value: 2, label: 'Swing (2:1)' },
	{ value: 3, label: 'Heavy swing (3:1)' }
] as const;
