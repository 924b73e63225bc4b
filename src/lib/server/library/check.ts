import {
	isInstrumentId,
	isQualityId,
	INSTRUMENT_IDS,
	QUALITY_IDS,
	type QualityId
} from '../../music/index';
import { LibraryError } from './errors';
import { lickGrid, type LickVariant } from './grid';
import { checkLickAbc, readLickInput, suggestTags } from './licks';

/**
 * The editor's check of unsaved abc: read strictly (422 with line, column and sentence), then the
 * twelve keys over one quality for one instrument, the home key and quality, and the device tags
 * the line suggests. Needs no lick row, so it runs as the person types.
 */
export interface CheckAnswer {
	home: { key: string; quality: QualityId | null };
	/** The lick in the twelve keys, cycle of fourths from C. */
	variants: LickVariant[];
	/** Device tags found in the line (in its own key and quality). */
	suggestedTags: string[];
	/** The line as written: home key, own quality, concert pitch, with degrees and devices. */
	own: LickVariant;
	/**
	 * The computed re-mapping over the asked quality in the home key at concert pitch, ignoring
	 * any hand-written version (what a hand-written version replaces); null without a quality.
	 */
	remapped: LickVariant | null;
}

/**
 * @example checkDraft({ abc: 'X:1\nK:C\n"C7"CEGB|' }) // { home: { key: 'C', quality: '7' }, … }
 */
export async function checkDraft(body: unknown): Promise<CheckAnswer> {
	if (!body || typeof body !== 'object' || Array.isArray(body)) {
		throw new LibraryError(400, 'The body must be a JSON object such as {"abc": "X:1\\nK:C\\n…"}.');
	}
	const { quality, instrument, ...rest } = body as Record<string, unknown>;
	const unknown = Object.keys(rest).filter((k) => k !== 'abc' && k !== 'versions');
	if (unknown.length) {
		throw new LibraryError(
			400,
			`Unknown field “${unknown[0]}”: send abc, versions, quality or instrument.`
		);
	}
	const input = readLickInput(rest);
	if (input.abc === undefined) throw new LibraryError(400, 'Send the lick as abc text in “abc”.');
	if (
		quality !== undefined &&
		quality !== '' &&
		(typeof quality !== 'string' || !isQualityId(quality))
	) {
		throw new LibraryError(422, `“quality” is one of ${QUALITY_IDS.join(', ')}.`, {
			field: 'quality'
		});
	}
	if (
		instrument !== undefined &&
		instrument !== '' &&
		(typeof instrument !== 'string' || !isInstrumentId(instrument))
	) {
		throw new LibraryError(422, `“instrument” is one of ${INSTRUMENT_IDS.join(', ')}.`, {
			field: 'instrument'
		});
	}
	const checked = checkLickAbc(input.abc, input.versions ?? {});
	// Without a chord the line can still be moved to every key, just not to another quality.
	const over = checked.homeQuality && quality ? (quality as QualityId) : undefined;
	const variants = await lickGrid(input.abc, {
		quality: over,
		instrument: (instrument as string) || undefined,
		versions: input.versions
	});
	const [own] = await lickGrid(input.abc, { keys: [checked.homeKey] });
	const remapped = over
		? (await lickGrid(input.abc, { keys: [checked.homeKey], quality: over }))[0]
		: null;
	return {
		home: { key: checked.homeKey, quality: checked.homeQuality },
		variants,
		suggestedTags: suggestTags(own),
		own,
		remapped
	};
}
