/**
 * Kit's own check against cross-site form posts, kept for every path but one. Kit's check is
 * all or nothing (`csrf.trustedOrigins`), and the one-click unsubscribe of RFC 8058 is by design
 * a form POST from a mail provider with no Origin of ours: so svelte.config.js turns Kit's check
 * off and `handleCrossSiteForms` in hooks.server.ts runs this one, identical in what it refuses
 * and how it answers, with the exempt paths left out. An exempt path must not act on cookies: the
 * one-click endpoint's credential is the signed token in its address.
 */

/** Paths whose form POSTs may come from anywhere. */
export const CROSS_SITE_FORM_PATHS: readonly string[] = ['/api/unsubscribe'];

// The content types a plain HTML form can send cross-site without a preflight, plus Kit's own
// binary form encoding (as in Kit's `is_form_content_type`).
const FORM_TYPES = [
	'application/x-www-form-urlencoded',
	'multipart/form-data',
	'text/plain',
	'application/x-sveltekit-formdata'
];
const UNSAFE_METHODS = ['POST', 'PUT', 'PATCH', 'DELETE'];

/**
 * A 403 for a form submission from another origin, or null when the request may pass.
 * @example refuseCrossSiteForm(new Request('http://a.test/x', { method: 'POST', headers: { 'content-type': 'text/plain', origin: 'http://evil.test' } }), new URL('http://a.test/x')) // Response 403
 */
export function refuseCrossSiteForm(
	request: Request,
	url: URL,
	exempt: readonly string[] = CROSS_SITE_FORM_PATHS
): Response | null {
	if (!UNSAFE_METHODS.includes(request.method)) return null;
	const type = (request.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();
	if (!FORM_TYPES.includes(type)) return null;
	if (request.headers.get('origin') === url.origin) return null;
	if (exempt.includes(url.pathname)) return null;
	const message = `Cross-site ${request.method} form submissions are forbidden`;
	if (request.headers.get('accept') === 'application/json') {
		return Response.json({ message }, { status: 403 });
	}
	return new Response(message, { status: 403, headers: { 'content-type': 'text/plain' } });
}
