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

/**
 * A `next` parameter made safe to redirect to: only a path on this site, never `//other.host`
 * or `https://…`. It comes back percent-encoded, because a Location header holding a character
 * beyond Latin-1 (`/☃`) makes the Response constructor throw, and the redirect would become a 500.
 *
 * @example safeNext('/teach/decks') // → '/teach/decks'; safeNext('//evil.test') // → '/home'
 */
export function safeNext(value: string | null | undefined, fallback = '/home'): string {
	if (!value || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) {
		return fallback;
	}
	// eslint-disable-next-line no-control-regex
	if (/[\u0000-\u001f]/.test(value)) return fallback;
	const base = 'http://same.site.invalid';
	const resolved = new URL(value, base);
	if (resolved.origin !== base) return fallback;
	return resolved.pathname + resolved.search + resolved.hash;
}
