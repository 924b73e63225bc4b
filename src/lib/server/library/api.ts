/**
 * The library endpoints' shared edge: who is asking, the list query, the per-person limit on
 * engine work. Kept out of the route files, which may export only their HTTP handlers.
 */
import {
	createRateLimiter,
	memoryStore,
	type RateLimiter,
	type RateLimiterOptions
} from '../auth/rate-limit';
import type { SessionUser } from '../auth/session';
import { apiError } from '../http/json';
import type { Actor } from './access';
import { answerOf, LibraryError } from './errors';
import {
	LICK_SCOPES,
	LICK_SORTS,
	MAX_PAGE,
	type LickQuery,
	type LickScope,
	type LickSort
} from './licks';

/** The signed-in actor, or a 401 answer. */
export function actorOf(locals: { user: SessionUser | null }): Actor | Response {
	const user = locals.user;
	if (!user) return apiError(401, 'Sign in to use your library.');
	return { id: user.id, role: user.role };
}

function readInt(url: URL, name: string, min: number, max: number): number | undefined {
	const raw = url.searchParams.get(name);
	if (raw === null || raw === '') return undefined;
	const n = Number(raw);
	if (!Number.isInteger(n) || n < min || n > max) {
		throw new LibraryError(400, `“${name}” is a whole number from ${min} to ${max}.`, {
			field: name
		});
	}
	return n;
}

/**
 * `q`, `limit` (1–100) and `offset` of a list request; 400 for a bad number.
 * @example readPaging(new URL('http://x/?q=turn&limit=10')) // { q: 'turn', limit: 10 }
 */
export function readPaging(url: URL): { q?: string; limit?: number; offset?: number } {
	const q = url.searchParams.get('q') ?? undefined;
	if (q !== undefined && q.length > 200) {
		throw new LibraryError(400, 'A search is at most 200 characters.', { field: 'q' });
	}
	return {
		q,
		limit: readInt(url, 'limit', 1, MAX_PAGE),
		offset: readInt(url, 'offset', 0, 1_000_000_000)
	};
}

/**
 * The lick list's query: paging plus `quality`, `key`, `deck`, `scope` and `sort`.
 * @example readLickQuery(new URL('http://x/?quality=m7&sort=title')) // { quality: 'm7', sort: 'title' }
 */
export function readLickQuery(url: URL): LickQuery {
	const query: LickQuery = readPaging(url);
	const p = url.searchParams;
	if (p.get('quality')) query.quality = p.get('quality')!;
	if (p.get('key')) query.key = p.get('key')!;
	if (p.get('deck')) query.deckId = p.get('deck')!;
	const scope = p.get('scope');
	if (scope) {
		if (!LICK_SCOPES.includes(scope as LickScope)) {
			throw new LibraryError(400, `“scope” is one of ${LICK_SCOPES.join(', ')}.`, {
				field: 'scope'
			});
		}
		query.scope = scope as LickScope;
	}
	const sort = p.get('sort');
	if (sort) {
		if (!(LICK_SORTS as readonly string[]).includes(sort)) {
			throw new LibraryError(400, `“sort” is one of ${LICK_SORTS.join(', ')}.`, { field: 'sort' });
		}
		query.sort = sort as LickSort;
	}
	return query;
}

/** Engine work (checks, grids) per person: 120 a minute covers fast typing with a debounce. */
export const CHECK_LIMIT: RateLimiterOptions = { max: 120, windowMs: 60_000 };
/**
 * In this process's memory, deliberately, like the public transposition limit: it shares out
 * this process's engine time, and the editor checks as the teacher types, which should not
 * queue a database write each time.
 */
const newCheckLimiter = (options: RateLimiterOptions) =>
	createRateLimiter('library-check', options, memoryStore());
let checkLimiter: RateLimiter = newCheckLimiter(CHECK_LIMIT);
export function libraryCheckLimiter(): RateLimiter {
	return checkLimiter;
}
export function configureLibraryCheckLimit(options: RateLimiterOptions = CHECK_LIMIT): void {
	checkLimiter = newCheckLimiter(options);
}

/**
 * Run an endpoint's body for the signed-in actor: 401 without a session, a service's refusal
 * as its `{error}` answer; any other fault stays a fault.
 * @example return withActor(locals, async (actor) => json(await getLick(actor, params.id)))
 */
export async function withActor(
	locals: { user: SessionUser | null },
	body: (actor: Actor) => Promise<Response>
): Promise<Response> {
	const actor = actorOf(locals);
	if (actor instanceof Response) return actor;
	try {
		return await body(actor);
	} catch (e) {
		if (e instanceof LibraryError) return answerOf(e);
		throw e;
	}
}

/** The largest lick body read: the abc, nine hand-written versions and a long note. */
export const MAX_LICK_BODY_BYTES = 256 * 1024;
