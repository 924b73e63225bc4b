/**
 * The music engine's facade (prepare.ts parses once, layer.ts re-maps over a quality, variant.ts
 * renders one variant): abc in, a variant out (key, chord quality, instrument), or the whole
 * grid of variants from one parse. Parsing happens once per lick; each variant is a walk over the
 * parsed note heads with small integer arithmetic and one pass of the emitter.
 */
import type { TritoneSpelling } from './keys';
import type { KeyName, QualityId } from './types';
import { prepareLick, VariantRequestError, type HandWrittenVersions } from './prepare';
import {
	renderVariant,
	type VariantOptions,
	type VariantResult,
	type VariantSuccess
} from './variant';

export type { AbcError } from './abc/tokenize';
export {
	prepareLick,
	readKeyName,
	VariantRequestError,
	type HandWrittenVersions,
	type PreparedLick,
	type PrepareResult
} from './prepare';
export {
	renderVariant,
	type VariantNote,
	type VariantOptions,
	type VariantResult,
	type VariantSuccess
} from './variant';

/**
 * Parse and render one variant; errors in the abc come back positioned, errors in the request
 * (an unknown key, quality or instrument) as a message.
 * @example computeVariant({ abc: 'X:1\nK:Bb\n"Bb7"B2|', to: 'C' }).abc // 'X:1\nK:C\n"C7"c2|'
 */
export function computeVariant(
	request: { abc: string; versions?: HandWrittenVersions } & VariantOptions
): VariantResult | { ok: false; error: { message: string; line?: number; column?: number } } {
	if (typeof request.abc !== 'string')
		return { ok: false, error: { message: 'The abc text is missing.' } };
	const prepared = prepareLick(request.abc, request.versions);
	if (!prepared.ok) return prepared;
	try {
		return renderVariant(prepared.lick, { analyse: true, ...request });
	} catch (e) {
		if (e instanceof VariantRequestError) return { ok: false, error: { message: e.message } };
		throw e;
	}
}

export interface GridResult {
	ok: true;
	variants: VariantSuccess[];
}

/**
 * Every key × quality variant of a lick for one instrument, parsing once.
 * @example computeGrid(abc, ['C', 'F'], ['7', 'm7'], 'concert').variants.length // 4
 */
export function computeGrid(
	abc: string,
	keys: readonly KeyName[],
	qualities: readonly QualityId[],
	instrument?: string,
	tritone: TritoneSpelling = 'Gb',
	versions: HandWrittenVersions = {}
): GridResult | { ok: false; error: { message: string; line?: number; column?: number } } {
	const prepared = prepareLick(abc, versions);
	if (!prepared.ok) return prepared;
	const variants: VariantSuccess[] = [];
	try {
		for (const to of keys) {
			for (const quality of qualities) {
				variants.push(renderVariant(prepared.lick, { to, quality, instrument, tritone }));
			}
		}
	} catch (e) {
		if (e instanceof VariantRequestError) return { ok: false, error: { message: e.message } };
		throw e;
	}
	return { ok: true, variants };
}
