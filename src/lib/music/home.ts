import { prepareLick } from './engine';
import { formatNoteName } from './pitch';
import type { AbcError } from './abc/tokenize';
import type { QualityId } from './types';

/** What a lick's own text says about its home: the tonic of its first K: and its first chord. */
export interface LickHome {
	/** Tonic of the first key signature ('Eb', 'F#'); 'C' for `K:none`. */
	key: string;
	/** Quality of the first chord symbol, or null when the line has none. */
	quality: QualityId | null;
}

/**
 * Read the home key and chord quality a lick is written in, or the positioned error that stops it.
 * @example readLickHome('X:1\nK:Bb\n"Bb7"B2|') // { ok: true, home: { key: 'Bb', quality: '7' } }
 */
export function readLickHome(
	abc: string
): { ok: true; home: LickHome } | { ok: false; error: AbcError } {
	const prepared = prepareLick(abc);
	if (!prepared.ok) return prepared;
	const first = prepared.lick.keys[0];
	const key = !first || first.none ? 'C' : formatNoteName(first.tonic);
	return { ok: true, home: { key, quality: prepared.lick.quality } };
}
