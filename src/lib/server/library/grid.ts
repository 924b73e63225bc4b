import {
	CYCLE_OF_FOURTHS,
	prepareLick,
	renderVariant,
	VariantRequestError,
	type HandWrittenVersions,
	type QualityId,
	type VariantSuccess
} from '../../music/index';

/** A variant as the API sends it: the engine's result without its `ok` flag. */
export type LickVariant = Omit<VariantSuccess, 'ok'>;

export type GridAnswer =
	| { ok: true; variants: LickVariant[] }
	| { ok: false; error: { message: string; line?: number; column?: number; version?: string } };

/**
 * A lick in the given keys (all twelve, round the cycle of fourths, when none is named) over one
 * quality for one instrument, with degrees and devices, from one parse. The one place the
 * library asks the engine for many variants at once: when the engine's bounded grid lands, only
 * this body changes.
 * @example lickGrid('X:1\nK:C\n"C7"CEG', { instrument: 'trumpet' }).variants.length // 12
 */
export function lickGrid(
	abc: string,
	options: {
		keys?: readonly string[];
		quality?: QualityId;
		instrument?: string;
		versions?: HandWrittenVersions;
	} = {}
): GridAnswer {
	const prepared = prepareLick(abc, options.versions ?? {});
	if (!prepared.ok) return prepared;
	const variants: LickVariant[] = [];
	try {
		for (const to of options.keys ?? CYCLE_OF_FOURTHS) {
			const { ok: _ok, ...variant } = renderVariant(prepared.lick, {
				to,
				quality: options.quality,
				instrument: options.instrument,
				analyse: true
			});
			variants.push(variant);
		}
	} catch (e) {
		if (e instanceof VariantRequestError) return { ok: false, error: { message: e.message } };
		throw e;
	}
	return { ok: true, variants };
}
