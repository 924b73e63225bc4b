/**
 * The server's one door to the music engine: every route that shows a lick in a key (the public
 * transpose and grid endpoints, the library's variants, the drill) renders through
 * `renderLickVariant` or `renderLickGrid`, so that each answer is bounded and the engine's work
 * is shared fairly between requests.
 *
 * Bounds, measured rather than guessed (`npm run bench`, tests/unit/server/music/render.test.ts):
 * - an answer carries about 300 bytes per note per variant (pitch, degree, chord, written names)
 *   plus the abc text; a request whose answer would pass `MAX_ANSWER_BYTES` is refused with a
 *   sentence before any work is done. That also bounds the work: a full grid at the limit takes
 *   a few milliseconds.
 * - a grid is rendered a key at a time, giving the event loop back between keys once a few
 *   milliseconds have passed, so a sign-in or `/api/me` waits for one slice, not a whole grid.
 * - a global budget of engine time a second, beside each route's per-address limit: thirty
 *   heavy requests from thirty addresses queue for a second rather than stall the server.
 */
import {
	CYCLE_OF_FOURTHS,
	jazzTonic,
	prepareLick,
	readKeyName,
	renderVariant,
	VariantRequestError,
	type HandWrittenVersions,
	type KeyName,
	type PreparedLick,
	type QualityId,
	type TritoneSpelling,
	type VariantOptions,
	type VariantSuccess
} from '$lib/music';
import { chromaOfName } from '$lib/music/degrees';
import { formatNoteName } from '$lib/music/pitch';

/** The largest answer sent, in bytes of JSON: a four-bar lick's full 12 × 9 grid is about 730 KB. */
export const MAX_ANSWER_BYTES = 1024 * 1024;

/**
 * JSON bytes per note per variant, and per variant besides its notes and abc: measured 264–296
 * a note on our licks, devices and warnings included (tests/unit/server/music/render.test.ts
 * checks that the estimate stays above the real size).
 */
export const BYTES_PER_NOTE = 300;
const BYTES_PER_VARIANT = 512;

/** Engine milliseconds allowed a second across every request (a fifth of one core). */
export const ENGINE_MS_PER_SECOND = 200;

/** Give the event loop back after this many milliseconds of grid work. */
export const SLICE_MS = 4;
let sliceMs = SLICE_MS;

/** A variant as the API sends it: the engine's answer without its `ok` tag. */
export type VariantAnswer = Omit<VariantSuccess, 'ok'>;

export interface LickSource {
	abc: string;
	/** Hand-written versions by quality (abc each), which replace the computed re-mapping. */
	versions?: HandWrittenVersions;
}

export interface GridRequest {
	/** Target keys; all twelve round the cycle of fourths, spelled for the lick's mode, when absent. */
	keys?: readonly KeyName[];
	/** Qualities; the lick's own when absent. */
	qualities?: readonly QualityId[];
	instrument?: string;
	tritone?: TritoneSpelling;
}

export interface GridAnswer {
	/** One variant per key × quality, keys outer: variants[k * qualities.length + q]. */
	variants: VariantAnswer[];
	keys: KeyName[];
	/** The qualities rendered; null stands for the lick's own when it names none. */
	qualities: (QualityId | null)[];
	instrument: string;
}

/** Why a render was refused: the status and sentence a route answers with. */
export interface RenderRefusal {
	ok: false;
	status: 413 | 422 | 503;
	message: string;
	line?: number;
	column?: number;
	version?: string;
	retryAfterSeconds?: number;
}

export type RenderOutcome<T> = { ok: true; value: T } | RenderRefusal;

// --- prepared licks, shared by every route ---------------------------------------------------

const PREPARED_CACHE_SIZE = 200;
const prepared = new Map<string, PreparedLick>();

/** A lick parsed once and kept (most recently used last), with its re-mappings cached on it. */
function preparedLick(source: LickSource): { ok: true; lick: PreparedLick } | RenderRefusal {
	const versions = source.versions ?? {};
	const id = JSON.stringify([source.abc, versions]);
	const hit = prepared.get(id);
	if (hit) {
		prepared.delete(id);
		prepared.set(id, hit);
		return { ok: true, lick: hit };
	}
	const result = prepareLick(source.abc, versions);
	if (!result.ok) return { ok: false, status: 422, ...result.error };
	prepared.set(id, result.lick);
	if (prepared.size > PREPARED_CACHE_SIZE) prepared.delete(prepared.keys().next().value as string);
	return { ok: true, lick: result.lick };
}

// --- the global engine budget ----------------------------------------------------------------

/** Engine work spent in the last second: [end time, milliseconds] pairs, oldest first. */
const spent: [number, number][] = [];
let budgetMs = ENGINE_MS_PER_SECOND;

/** Set the global budget and the grid's slice (tests use small ones); defaults without arguments. */
export function configureEngineBudget(msPerSecond = ENGINE_MS_PER_SECOND, slice = SLICE_MS): void {
	budgetMs = msPerSecond;
	sliceMs = slice;
	spent.length = 0;
}

function spentLastSecond(now: number): number {
	while (spent.length && spent[0][0] <= now - 1000) spent.shift();
	let total = 0;
	for (const [, ms] of spent) total += ms;
	return total;
}

function budgetRefusal(now: number): RenderRefusal | null {
	if (spentLastSecond(now) < budgetMs) return null;
	return {
		ok: false,
		status: 503,
		message: 'The music engine is busy with many requests right now; try again in a second or two.',
		retryAfterSeconds: 1
	};
}

function record(startedAt: number): void {
	const now = performance.now();
	spent.push([Date.now(), now - startedAt]);
}

// --- size bounds ------------------------------------------------------------------------------

/**
 * A generous estimate of an answer's JSON size, from the lick's size alone.
 * @example estimateAnswerBytes(lick, 108) // about 940 000 for a 26-note lick
 */
export function estimateAnswerBytes(lick: PreparedLick, variants: number): number {
	const { tune } = lick;
	const abcBytes = tune.tokens.reduce((n, t) => n + t.text.length, 0);
	return variants * (BYTES_PER_VARIANT + 1.2 * abcBytes + BYTES_PER_NOTE * tune.notes.length);
}

function sizeRefusal(lick: PreparedLick, variants: number): RenderRefusal | null {
	const bytes = estimateAnswerBytes(lick, variants);
	if (bytes <= MAX_ANSWER_BYTES) return null;
	const kb = (n: number) => Math.round(n / 1024);
	return {
		ok: false,
		status: 413,
		message:
			variants === 1
				? `This lick has ${lick.tune.notes.length} notes: its answer would be about ${kb(bytes)} KB, more than the ${kb(MAX_ANSWER_BYTES)} KB we send. A lick is a phrase of a few bars; split a longer line into several licks.`
				: `${variants} variants of this ${lick.tune.notes.length}-note lick would make an answer of about ${kb(bytes)} KB, more than the ${kb(MAX_ANSWER_BYTES)} KB we send: ask for fewer keys or qualities at a time.`
	};
}

/** The API's shape of a variant. */
export function toVariantAnswer(variant: VariantSuccess): VariantAnswer {
	const { ok: _, ...answer } = variant;
	return answer;
}

const requestRefusal = (e: unknown): RenderRefusal => {
	if (e instanceof VariantRequestError) return { ok: false, status: 422, message: e.message };
	throw e;
};

/** The longest a waiting render holds back for the global budget before it goes ahead. */
const MAX_WAIT_MS = 2000;

// --- the two doors ----------------------------------------------------------------------------

/**
 * One variant of a lick (key, quality, instrument), with its devices, bounded like a grid.
 * @example await renderLickVariant({ abc }, { to: 'Eb', instrument: 'alto-sax' }) // { ok: true, value: { key: 'Eb', writtenTonic: 'C', … } }
 */
export async function renderLickVariant(
	source: LickSource,
	options: VariantOptions = {},
	whenBusy: 'refuse' | 'wait' = 'refuse'
): Promise<RenderOutcome<VariantAnswer>> {
	// A signed-in page that renders many prompts in one request (the drill's queue) waits its turn
	// instead of refusing itself halfway: the budget still spaces its work out, so other requests
	// get the engine in between, and after a bounded wait it goes ahead.
	if (whenBusy === 'wait') {
		for (let waited = 0; waited < MAX_WAIT_MS && budgetRefusal(Date.now()); waited += 25) {
			await new Promise((resolve) => setTimeout(resolve, 25));
		}
	} else {
		const busy = budgetRefusal(Date.now());
		if (busy) return busy;
	}
	const started = performance.now();
	try {
		const lick = preparedLick(source);
		if (!lick.ok) return lick;
		const tooBig = sizeRefusal(lick.lick, 1);
		if (tooBig) return tooBig;
		try {
			return {
				ok: true,
				value: toVariantAnswer(renderVariant(lick.lick, { analyse: true, ...options }))
			};
		} catch (e) {
			return requestRefusal(e);
		}
	} finally {
		record(started);
	}
}

/**
 * Every key × quality of a lick for one instrument, from one parse: the twelve-key view, the
 * drill's key picker, the library's variants page.
 * @example await renderLickGrid({ abc }, { qualities: ['7', 'm7'] }) // { ok: true, value: { variants: [24 variants], keys: ['C', 'F', …] } }
 */
export async function renderLickGrid(
	source: LickSource,
	request: GridRequest = {}
): Promise<RenderOutcome<GridAnswer>> {
	const busy = budgetRefusal(Date.now());
	if (busy) return busy;
	let started = performance.now();
	const lick = preparedLick(source);
	if (!lick.ok) {
		record(started);
		return lick;
	}
	const home = lick.lick;
	const tritone = request.tritone ?? 'Gb';
	const keys = request.keys ? [...request.keys] : twelveKeysFor(home, tritone);
	const qualities: (QualityId | null)[] = request.qualities?.length
		? [...request.qualities]
		: [home.quality];
	const tooBig = sizeRefusal(home, keys.length * qualities.length);
	if (tooBig) {
		record(started);
		return tooBig;
	}
	const variants: VariantAnswer[] = [];
	let sliceStart = started;
	try {
		for (const to of keys) {
			for (const quality of qualities) {
				const v = renderVariant(home, {
					to,
					quality: quality ?? undefined,
					instrument: request.instrument,
					tritone,
					analyse: true
				});
				variants.push(toVariantAnswer(v));
			}
			// Let other requests in between keys once this slice has run its course.
			if (performance.now() - sliceStart >= sliceMs) {
				record(started);
				await new Promise((resolve) => setImmediate(resolve));
				started = sliceStart = performance.now();
			}
		}
	} catch (e) {
		record(started);
		return requestRefusal(e);
	}
	record(started);
	return {
		ok: true,
		value: {
			variants,
			keys,
			qualities,
			instrument: variants[0]?.instrument ?? request.instrument ?? 'concert'
		}
	};
}

/**
 * The twelve keys round the cycle of fourths, spelled as jazz spells them in the lick's mode
 * (C# minor rather than D-flat minor), the tritone key by the setting (common practice).
 * @example twelveKeysFor(lickInAMinor, 'Gb') // ['C', 'F', 'Bb', 'Eb', 'G#', 'C#', 'F#', …]
 */
export function twelveKeysFor(lick: PreparedLick, tritone: TritoneSpelling): KeyName[] {
	const first = lick.keys[0];
	const mode = first && !first.none ? first.mode : 'major';
	return CYCLE_OF_FOURTHS.map((k) => {
		const t = jazzTonic(chromaOfName(k), mode, tritone);
		return formatNoteName(t);
	});
}

/** Read a list of target keys; throws nothing, answers a refusal naming the bad value. */
export function readKeyList(keys: readonly string[]): RenderRefusal | null {
	for (const k of keys) {
		try {
			readKeyName(k);
		} catch (e) {
			return requestRefusal(e);
		}
	}
	return null;
}
