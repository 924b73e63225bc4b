import type { Role } from '../db/models/index';

/** Where each role lands after signing in. */
export function homeFor(role: Role): string {
	return role === 'admin' ? '/admin' : role === 'teacher' ? '/teach' : '/home';
}

/** Where to send someone who must sign in first, coming back to `url` afterwards. */
export function signInUrl(url: URL): string {
	const next = url.pathname + url.search;
	return next === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(next)}`;
}

const SAME_SITE = 'http://same.site.invalid';

/**
 * A `next` parameter made safe to redirect to: only a path on this site, never `//other.host`
 * or `https://…`. The decision is taken on the URL as a browser will read it, not on the text
 * as typed: `/.//evil.test`, `/..//evil.test`, `/%2e//evil.test` and `/./\evil.test` all start
 * with one slash, yet normalise to `//evil.test`, which a browser takes for another host.
 * It comes back percent-encoded, because a Location header holding a character beyond Latin-1
 * (`/☃`) makes the Response constructor throw, and the redirect would become a 500.
 *
 * @example safeNext('/teach/decks') // → '/teach/decks'; safeNext('/.//evil.test') // → '/home'
 */
export function safeNext(value: string | null | undefined, fallback = '/home'): string {
	if (typeof value !== 'string' || !value.startsWith('/')) return fallback;
	// Control characters (tabs and line breaks included) are dropped by URL parsers, so
	// `/\t/evil.test` would read as `//evil.test`; no real path of ours holds one.
	// eslint-disable-next-line no-control-regex
	if (/[\u0000-\u001f\u007f-\u009f]/.test(value)) return fallback;
	let resolved: URL;
	try {
		resolved = new URL(value, SAME_SITE);
	} catch {
		return fallback;
	}
	if (resolved.origin !== SAME_SITE) return fallback;
	const path = resolved.pathname + resolved.search + resolved.hash;
	if (!isSameSitePath(path)) return fallback;
	return path;
}

/** A path a browser resolves on this site: one slash, then anything but a slash or backslash. */
function isSameSitePath(path: string): boolean {
	return path.startsWith('/') && path[1] !== '/' && path[1] !== '\\';
}
