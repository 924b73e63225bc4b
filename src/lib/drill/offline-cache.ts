/**
 * The names and rules the service worker and the drill page share for what is kept offline:
 * the app's built files (one cache per build) and the drill's own page and data (one cache,
 * refreshed on every visit and emptied on sign-out, since it belongs to the learner who is signed
 * in).
 */

export const SHELL_CACHE_PREFIX = 'twelvefold-shell-';
export const DRILL_CACHE = 'twelvefold-drill';

/**
 * Header on an answer the service worker served from its kept copy because the network failed:
 * the page then knows it is offline even where the browser's online flag says otherwise.
 */
export const KEPT_COPY_HEADER = 'x-twelvefold-kept-copy';

/** Same-origin GET paths answered from the network when it works and from the cache when not. */
const DRILL_PATHS = ['/drill', '/drill/__data.json', '/api/drill/today'];

/**
 * Whether a GET of this path belongs to the drill's offline copy.
 * @example isDrillPath('/drill/__data.json') // true
 */
export function isDrillPath(pathname: string): boolean {
	return DRILL_PATHS.includes(pathname);
}

/**
 * Whether a request signs the learner out (then the drill's offline copy is emptied).
 * @example isSignOut('POST', '/sign-out') // true
 */
export function isSignOut(method: string, pathname: string): boolean {
	return method === 'POST' && (pathname === '/sign-out' || pathname === '/api/auth/sign-out');
}
