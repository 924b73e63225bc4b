/**
 * The music engine's public face: everything a route, a service or a component needs, from one
 * import (`import { computeVariant } from '$lib/music'`). Pure code, safe in the browser.
 */
export {
	computeGrid,
	computeVariant,
	prepareLick,
	readKeyName,
	renderVariant,
	VariantRequestError,
	type GridResult,
	type HandWrittenVersions,
	type PreparedLick,
	type PrepareResult,
	type VariantNote,
	type VariantOptions,
	type VariantResult,
	type VariantSuccess
} from './engine';
export { MAX_ABC_BYTES, tokenize, type AbcError, type Token } from './abc/tokenize';
export { parseAbc, type ParsedAbc } from './abc/parse';
export { emitAbc } from './abc/emit';
export { CYCLE_OF_FOURTHS, MAJOR_KEY_SPELLINGS, MINOR_KEY_SPELLINGS } from './key-data';
export {
	jazzTonic,
	keyOf,
	parseKeyField,
	type KeySignature,
	type Mode,
	type TritoneSpelling
} from './keys';
export { parseChordSymbol, formatChordSymbol } from './chord-symbol';
export { isQualityId } from './qualities';
export { QUALITY_LABELS } from './qualities-data';
export { beatsPerBar, readTempo } from './meter';
export { wrapBars } from './abc/layout';
export { GUITAR_OPEN_STRINGS, GUITAR_TABLATURE, fretPitch } from './tablature';
export { INSTRUMENT_IDS, INSTRUMENT_ROWS, isInstrumentId, type InstrumentId } from './instruments';
export {
	QUALITY_IDS,
	type ChordContext,
	type KeyName,
	type MusicWarning,
	type QualityId,
	type SoundingNote
} from './types';
export { readLickHome, type LickHome } from './home';
