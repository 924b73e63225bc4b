/**
 * Screen words for the library's stored values: chord qualities, visibility and feel. One place,
 * so the table, the editor, the print sheet and the share page say the same thing.
 */
export const QUALITY_LABELS: Record<string, string> = {
	'7': 'Dominant (7)',
	m7: 'Minor 7th (m7)',
	maj7: 'Major 7th (maj7)',
	m7b5: 'Half-diminished (m7♭5)',
	'7alt': 'Altered (7alt)',
	dim7: 'Diminished (dim7)',
	'6': 'Major 6th (6)',
	m6: 'Minor 6th (m6)',
	'7sus4': 'Suspended (7sus4)'
};

/** Short form for a table cell. */
export const QUALITY_SHORT: Record<string, string> = {
	'7': '7',
	m7: 'm7',
	maj7: 'maj7',
	m7b5: 'm7♭5',
	'7alt': '7alt',
	dim7: 'dim7',
	'6': '6',
	m6: 'm6',
	'7sus4': '7sus4'
};

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
