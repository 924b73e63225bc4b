/**
 * The public transposition endpoint's edge: its rate limit and the reading of its loose JSON
 * input into engine options. Kept out of the route file because a `+server.ts` may export only
 * its HTTP handlers, and tests need to reset the limiter.
 */
import {
	createRateLimiter,
	memoryStore,
	type RateLimiter,
	type RateLimiterOptions
} from '../auth/rate-limit';
import {
	INSTRUMENT_IDS,
	isInstrumentId,
	isQualityId,
	QUALITY_IDS,
	readKeyName,
	VariantRequestError,
	type HandWrittenVersions,
	type QualityId,
	type TritoneSpelling,
	type VariantOptions
} from '$lib/music';

/** The largest request body read, in bytes (the abc itself may be at most 20 KB too). */
export const MAX_TRANSPOSE_BODY_BYTES = 20 * 1024;

/** 60 requests a minute per client address: plenty for a person trying licks, not for a scraper. */
export const TRANSPOSE_LIMIT: RateLimiterOptions = { max: 60, windowMs: 60_000 };

/**
 * Counted in this process's memory, deliberately: this limit shares out this process's engine
 * time (beside the engine's own per-process budget), and a database write for every
 * transposition would put the public try-it box in the single SQLite writer's queue, ahead of
 * the reviews. With several processes a client gets this allowance from each.
 */
const newLimiter = (options: RateLimiterOptions) =>
	createRateLimiter('transpose-address', options, memoryStore());
let limiter: RateLimiter = newLimiter(TRANSPOSE_LIMIT);

/** The limiter in use; `configureTransposeLimit` replaces it (tests use small windows). */
export function transposeLimiter(): RateLimiter {
	return limiter;
}

export function configureTransposeLimit(options: RateLimiterOptions = TRANSPOSE_LIMIT): void {
	limiter = newLimiter(options);
}

export type TransposeInput =
	| { ok: true; abc: string; options: VariantOptions; versions: HandWrittenVersions }
	| { ok: false; status: 400 | 422; message: string };

const FIELDS = ['abc', 'to', 'quality', 'instrument', 'tritone', 'versions'];

/**
 * Check the JSON body's fields and types; the engine checks the music.
 * @example readTransposeInput({ abc: 'X:1\nK:C\nC', to: 'Eb' }) // { ok: true, … }
 */
export function readTransposeInput(body: unknown): TransposeInput {
	if (!body || typeof body !== 'object' || Array.isArray(body)) {
		return {
			ok: false,
			status: 400,
			message: 'The body must be a JSON object such as {"abc": "X:1\\nK:C\\nCDEF|"}.'
		};
	}
	const value = body as Record<string, unknown>;
	const unknown = Object.keys(value).filter((k) => !FIELDS.includes(k));
	if (unknown.length) {
		return {
			ok: false,
			status: 400,
			message: `Unknown field ${unknown.map((k) => `“${k}”`).join(', ')}: send abc, to, quality, instrument, tritone or versions.`
		};
	}
	const { abc, to, quality, instrument, tritone, versions: versionsInput } = value;
	if (typeof abc !== 'string') {
		return { ok: false, status: 400, message: 'Send the lick’s abc notation as text in “abc”.' };
	}
	if (abc.trim() === '') {
		// Said to the person at the try-it box, who may never have written abc before.
		return {
			ok: false,
			status: 400,
			message:
				'There is no lick to play yet. Write it in abc notation: a key line such as “K:C”, then the notes, e.g. “G A B c d2”.'
		};
	}
	for (const [name, v] of Object.entries({ to, quality, instrument, tritone })) {
		if (v !== undefined && v !== null && typeof v !== 'string') {
			return { ok: false, status: 400, message: `“${name}” must be a string.` };
		}
	}
	const options: VariantOptions = {};
	if (typeof to === 'string' && to !== '') {
		try {
			readKeyName(to);
		} catch (e) {
			if (e instanceof VariantRequestError) return { ok: false, status: 422, message: e.message };
			throw e;
		}
		options.to = to;
	}
	if (typeof quality === 'string' && quality !== '') {
		if (!isQualityId(quality)) {
			return {
				ok: false,
				status: 422,
				message: `“${quality}” is not a chord quality: use one of ${QUALITY_IDS.join(', ')}.`
			};
		}
		options.quality = quality;
	}
	if (typeof instrument === 'string' && instrument !== '') {
		if (!isInstrumentId(instrument)) {
			return {
				ok: false,
				status: 422,
				message: `“${instrument}” is not an instrument: use one of ${INSTRUMENT_IDS.join(', ')}.`
			};
		}
		options.instrument = instrument;
	}
	if (typeof tritone === 'string' && tritone !== '') {
		if (tritone !== 'Gb' && tritone !== 'F#') {
			return {
				ok: false,
				status: 422,
				message: `“${tritone}” is not a tritone spelling: use Gb or F#.`
			};
		}
		options.tritone = tritone;
	}
	const versions = readVersions(versionsInput);
	if (!versions.ok) return versions;
	return { ok: true, abc, options, versions: versions.versions };
}

/**
 * Hand-written versions: an object from quality to abc text, e.g. `{"m7": "X:1\nK:C\n…"}`.
 * @example readVersions({ m7: 'X:1\nK:C\n"Cm7"C' }) // { ok: true, versions: { m7: … } }
 */
function readVersions(
	input: unknown
): { ok: true; versions: HandWrittenVersions } | { ok: false; status: 400 | 422; message: string } {
	if (input === undefined || input === null) return { ok: true, versions: {} };
	if (typeof input !== 'object' || Array.isArray(input)) {
		return {
			ok: false,
			status: 400,
			message:
				'“versions” must be an object from chord quality to abc, such as {"m7": "X:1\\nK:C\\n…"}.'
		};
	}
	const versions: HandWrittenVersions = {};
	for (const [quality, text] of Object.entries(input)) {
		if (!isQualityId(quality)) {
			return {
				ok: false,
				status: 422,
				message: `“${quality}” in “versions” is not a chord quality: use one of ${QUALITY_IDS.join(', ')}.`
			};
		}
		if (typeof text !== 'string' || text.trim() === '') {
			return {
				ok: false,
				status: 400,
				message: `The hand-written ${quality} version must be a non-empty abc string.`
			};
		}
		versions[quality] = text;
	}
	return { ok: true, versions };
}

export type GridInput =
	| {
			ok: true;
			abc: string;
			versions: HandWrittenVersions;
			keys?: string[];
			qualities?: QualityId[];
			instrument?: string;
			tritone?: TritoneSpelling;
	  }
	| { ok: false; status: 400 | 422; message: string };

const GRID_FIELDS = ['abc', 'keys', 'qualities', 'instrument', 'tritone', 'versions'];

/** At most this many target keys in one grid (every spelling of the twelve, twice over). */
export const MAX_GRID_KEYS = 24;

/**
 * Check a grid request's fields and types: `{abc, keys?, qualities?, instrument?, tritone?,
 * versions?}`; the engine checks the music.
 * @example readGridInput({ abc: 'X:1\nK:C\n"C7"C', keys: ['C', 'F'] }) // { ok: true, keys: ['C', 'F'], … }
 */
export function readGridInput(body: unknown): GridInput {
	if (!body || typeof body !== 'object' || Array.isArray(body)) {
		return {
			ok: false,
			status: 400,
			message:
				'The body must be a JSON object such as {"abc": "X:1\\nK:C\\nCDEF|", "keys": ["C", "F"]}.'
		};
	}
	const value = body as Record<string, unknown>;
	const unknown = Object.keys(value).filter((k) => !GRID_FIELDS.includes(k));
	if (unknown.length) {
		return {
			ok: false,
			status: 400,
			message: `Unknown field ${unknown.map((k) => `“${k}”`).join(', ')}: send abc, keys, qualities, instrument, tritone or versions.`
		};
	}
	const { keys, qualities, ...single } = value;
	const base = readTransposeInput(single);
	if (!base.ok) return base;
	const out: GridInput = { ok: true, abc: base.abc, versions: base.versions };
	if (base.options.instrument) out.instrument = base.options.instrument;
	if (base.options.tritone) out.tritone = base.options.tritone;
	if (keys !== undefined && keys !== null) {
		if (!Array.isArray(keys) || keys.some((k) => typeof k !== 'string')) {
			return {
				ok: false,
				status: 400,
				message: '“keys” must be a list of key names such as ["C", "F", "Bb"].'
			};
		}
		if (keys.length === 0 || keys.length > MAX_GRID_KEYS) {
			return {
				ok: false,
				status: 422,
				message: `Ask for 1 to ${MAX_GRID_KEYS} keys at a time, or leave “keys” out for all twelve.`
			};
		}
		for (const k of keys as string[]) {
			try {
				readKeyName(k);
			} catch (e) {
				if (e instanceof VariantRequestError) return { ok: false, status: 422, message: e.message };
				throw e;
			}
		}
		out.keys = keys as string[];
	}
	if (qualities !== undefined && qualities !== null) {
		if (!Array.isArray(qualities) || qualities.some((q) => typeof q !== 'string')) {
			return {
				ok: false,
				status: 400,
				message: '“qualities” must be a list of chord qualities such as ["7", "m7"].'
			};
		}
		const bad = (qualities as string[]).find((q) => !isQualityId(q));
		if (bad !== undefined) {
			return {
				ok: false,
				status: 422,
				message: `“${bad}” is not a chord quality: use one of ${QUALITY_IDS.join(', ')}.`
			};
		}
		if (qualities.length > QUALITY_IDS.length) {
			return {
				ok: false,
				status: 422,
				message: `Ask for at most ${QUALITY_IDS.length} qualities, each once.`
			};
		}
		out.qualities = [...new Set(qualities as QualityId[])];
	}
	return out;
}
