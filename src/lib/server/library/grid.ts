import type { HandWrittenVersions, QualityId } from '../../music/index';
import { renderLickGrid, type VariantAnswer } from '../music/render';
import { LibraryError } from './errors';

/** A variant as the API sends it: the engine's result without its `ok` flag. */
export type LickVariant = VariantAnswer;

/**
 * A lick in the given keys (all twelve round the cycle of fourths when none is named) over one
 * quality (its own when none) for one instrument, with degrees and devices, through the engine's
 * bounded grid; a refusal (invalid abc with its place, too large an answer, a busy engine)
 * is thrown as a `LibraryError` with the engine's status and sentence.
 * @example (await lickGrid('X:1\nK:C\n"C7"CEG', { instrument: 'trumpet' })).length // 12
 */
export async function lickGrid(
	abc: string,
	options: {
		keys?: readonly string[];
		quality?: QualityId;
		instrument?: string;
		versions?: HandWrittenVersions;
	} = {}
): Promise<LickVariant[]> {
	const outcome = await renderLickGrid(
		{ abc, versions: options.versions ?? {} },
		{
			keys: options.keys,
			qualities: options.quality ? [options.quality] : undefined,
			instrument: options.instrument
		}
	);
	if (!outcome.ok) {
		const { status, message, line, column, version, retryAfterSeconds } = outcome;
		throw new LibraryError(status, message, {
			...(line !== undefined ? { line } : {}),
			...(column !== undefined ? { column } : {}),
			...(version ? { version } : {}),
			...(retryAfterSeconds !== undefined ? { retryAfterSeconds } : {})
		});
	}
	return outcome.value.variants;
}
