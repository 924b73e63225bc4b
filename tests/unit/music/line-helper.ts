/** Build sounding lines for the harmony tests from pitch names and chord symbols. */
import { Note } from 'tonal';
import { parseChordSymbol } from '../../../src/lib/music/chord-symbol';
import type { ChordContext, SoundingNote } from '../../../src/lib/music/types';

export function chordOf(symbol: string): ChordContext {
	const c = parseChordSymbol(symbol);
	if (!c) throw new Error(`test chord '${symbol}' does not parse`);
	return { symbol: c.symbol, root: c.root, quality: c.quality, bass: c.bass };
}

/**
 * Eighth notes over one chord: `lineOver('D7', 'F#4 F4 E4')`. A bar of chords can be given as
 * `lineOver(['Dm7', 'G7'], 'F4 A4 | B4 D5')`, one chord per `|`-separated group.
 */
export function lineOver(chords: string | null | (string | null)[], line: string): SoundingNote[] {
	const groups = line.split('|').map((g) => g.trim().split(/\s+/).filter(Boolean));
	const symbols = Array.isArray(chords) ? chords : groups.map(() => chords);
	const out: SoundingNote[] = [];
	groups.forEach((group, g) => {
		const symbol = symbols[g];
		const chord = symbol ? chordOf(symbol) : null;
		for (const pitch of group) {
			const midi = Note.midi(pitch);
			if (midi === null) throw new Error(`test pitch '${pitch}' does not parse`);
			out.push({ index: out.length, pitch, midi, start: out.length / 8, duration: 1 / 8, chord });
		}
	});
	return out;
}
