import { isHttpError, isRedirect, json, type Handle, type RequestEvent } from '@sveltejs/kit';
import { CROSS_SITE_FORM_PATHS } from './cross-site';
import { BaseError as DatabaseLibraryError } from 'sequelize';
import errorTemplate from '../../../error.html?raw';
import { apiError, readTextUpTo } from './json';
import { hasPageServer, isEndpointRoute, ownActionNames, requestedActionName } from './routes';
import { findFormTextFault, findJsonTextFault, findUrlFault, type TextFault } from './text';

/**
 * The web edge: checks every request meets before any route runs, each in one place for the
 * whole app, so that a route added tomorrow is covered without doing anything.
 *
 * - `handleSecurityHeaders`: headers on every answer (the Content-Security-Policy itself is
 *   Kit's, from `kit.csp` in svelte.config.js).
 * - `handleRequestOrigin`: a request that changes something must come from this site.
 * - `handleTextFields`: no control characters in the address or in any text field.
 * - `handleActionNames`: a form post names one of the page's own actions, or gets 404.
 * - `handleDatabaseFailure` with `noteDatabaseFailure`: a database that fails answers 503.
 */

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The largest body the edge reads to inspect; larger ones are the route's to refuse (413). */
const MAX_INSPECTED_BYTES = 1024 * 1024;

function isStateChanging(event: RequestEvent): boolean {
	return !SAFE_METHODS.has(event.request.method);
}

/** A form post sent by `use:enhance`, which reads the answer as an action result. */
function isEnhancedAction(event: RequestEvent): boolean {
	return event.request.headers.get('x-sveltekit-action') === 'true';
}

/**
 * The static error page (`src/error.html`, the page Kit shows when a request fails before any
 * page renders) filled in here, so that refusals made at the edge read the same and, unlike
 * Kit's own, pass back through the header handle.
 */
export function staticErrorPage(status: number, message: string): Response {
	const html = errorTemplate
		.replaceAll('%sveltekit.status%', String(status))
		.replaceAll('%sveltekit.error.message%', escapeHtml(message));
	return new Response(html, { status, headers: { 'content-type': 'text/html; charset=utf-8' } });
}

function escapeHtml(text: string): string {
	return text.replace(
		/[&<>"']/g,
		(c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!
	);
}

function wantsJson(request: Request): boolean {
	const accept = request.headers.get('accept') ?? '';
	return accept.includes('application/json') && !accept.includes('text/html');
}

/**
 * A refusal in the shape the caller reads: `{error:{message, field}}` from an endpoint, an
 * action result for an enhanced form, `{message}` to a client that asked for JSON, otherwise
 * the readable error page.
 */
export function refuse(
	event: RequestEvent,
	status: number,
	message: string,
	field?: string
): Response {
	if (isEnhancedAction(event)) {
		return json({ type: 'error', error: { message } }, { status });
	}
	if (isEndpointRoute(event.route.id) || event.url.pathname.startsWith('/api/')) {
		return apiError(status, message, field ? { field } : {});
	}
	if (wantsJson(event.request)) return json({ message }, { status });
	return staticErrorPage(status, message);
}

/** Copies `response` when its headers are immutable (a fetched or `Response.redirect` answer). */
function withHeaders(response: Response, headers: Record<string, string>): Response {
	let target = response;
	try {
		for (const [name, value] of Object.entries(headers)) target.headers.set(name, value);
	} catch {
		target = new Response(response.body, response);
		for (const [name, value] of Object.entries(headers)) target.headers.set(name, value);
	}
	return target;
}

/**
 * Headers every answer carries. Pages rendered by Kit get its Content-Security-Policy (with
 * `frame-ancestors 'none'`); anything without one (JSON, redirects, the static error page)
 * gets a policy that loads nothing and cannot be framed. Anything a signed-in person sees, or
 * that starts a session, is never stored by a browser or a proxy.
 */
export const handleSecurityHeaders: Handle = async ({ event, resolve }) => {
	let response: Response;
	try {
		response = await resolve(event);
	} catch (thrown) {
		// A refusal thrown by a later handle (the role gate) would be answered by Kit outside this
		// handle; answered here, it carries the headers too. Redirects stay Kit's, which adds the
		// cookies set on the way (a cleared session cookie); so do data requests, which the
		// client router reads in Kit's own shape.
		if (event.isDataRequest || isRedirect(thrown) || !isHttpError(thrown)) throw thrown;
		response = refuse(event, thrown.status, thrown.body.message);
	}
	const headers: Record<string, string> = {
		'x-content-type-options': 'nosniff',
		'referrer-policy': 'same-origin',
		'x-frame-options': 'DENY'
	};
	if (!response.headers.has('content-security-policy')) {
		const html = (response.headers.get('content-type') ?? '').startsWith('text/html');
		headers['content-security-policy'] = html
			? "default-src 'none'; style-src 'unsafe-inline'; img-src 'self'; base-uri 'none'; form-action 'self'; frame-ancestors 'none'"
			: "default-src 'none'; frame-ancestors 'none'";
	}
	if (event.locals.user || response.headers.has('set-cookie')) {
		headers['cache-control'] = 'no-store';
	}
	return withHeaders(response, headers);
};

/**
 * Requests that change something must come from a page of this site. Kit checks this for form
 * posts; this covers JSON and every other body type too. A browser always names the `Origin`
 * of a cross-site request; a client with no `Origin` (a script, curl) carries no one's cookies
 * by accident, and is let through unless the browser's `Sec-Fetch-Site` says cross-site.
 */
export const handleRequestOrigin: Handle = ({ event, resolve }) => {
	if (!isStateChanging(event)) return resolve(event);
	// The one-click unsubscribe (RFC 8058) is posted by a mail provider; its credential is the
	// signed token in its address, never a cookie.
	if (CROSS_SITE_FORM_PATHS.includes(event.url.pathname)) return resolve(event);
	const origin = event.request.headers.get('origin');
	const site = event.request.headers.get('sec-fetch-site');
	const foreign =
		origin !== null
			? origin !== event.url.origin
			: site !== null && site !== 'same-origin' && site !== 'none';
	if (foreign) {
		return refuse(event, 403, 'Requests that change something must come from this site.');
	}
	return resolve(event);
};

/** The first refused text field of a JSON or form body, reading a copy of it. */
async function inspectBody(request: Request): Promise<TextFault | null> {
	const type = (request.headers.get('content-type') ?? '').toLowerCase();
	const json = /^application\/(?:[\w.+-]+\+)?json\b/.test(type);
	const form =
		type.startsWith('application/x-www-form-urlencoded') || type.startsWith('multipart/form-data');
	if (!json && !form) return null;
	if (Number(request.headers.get('content-length') ?? 0) > MAX_INSPECTED_BYTES) return null;
	const copy = request.clone();
	if (json) {
		const read = await readTextUpTo(copy, MAX_INSPECTED_BYTES);
		if (typeof read === 'string') return null;
		let parsed: unknown;
		try {
			parsed = JSON.parse(read.text);
		} catch {
			return null; // the route answers 400 for a body that is not JSON
		}
		return findJsonTextFault(parsed);
	}
	try {
		return findFormTextFault(await copy.formData());
	} catch {
		return null; // an unreadable form is the route's to refuse
	}
}

/**
 * No control character reaches a route: in the address of any request (400), or in any text
 * field of a JSON or form body of a request that changes something (422, naming the field).
 * The body is read from a copy; the route reads the original.
 */
export const handleTextFields: Handle = async ({ event, resolve }) => {
	const urlFault = findUrlFault(event.url);
	if (urlFault) return refuse(event, 400, urlFault);
	if (isStateChanging(event) && event.request.body) {
		const fault = await inspectBody(event.request);
		if (fault) return refuse(event, 422, fault.message, fault.field);
	}
	return resolve(event);
};

/**
 * A form post (`POST /page?/name`) must name one of the page's own actions. Kit looks the name
 * up on the page's `actions` object as it is, so `?/__proto__` or `?/constructor` reached
 * Object's prototype (500) and `?/toString` ran (200). Refused here with 404, before Kit looks.
 */
export const handleActionNames: Handle = async ({ event, resolve }) => {
	const id = event.route.id;
	if (event.request.method !== 'POST' || !hasPageServer(id)) return resolve(event);
	// A route with both a page and an endpoint gives plain POSTs to the endpoint.
	if (isEndpointRoute(id) && !isEnhancedAction(event)) {
		const accept = event.request.headers.get('accept') ?? '';
		if (!accept.includes('text/html')) return resolve(event);
	}
	const declared = await ownActionNames(id);
	if (declared === null) return resolve(event); // no actions: Kit answers 405
	const name = requestedActionName(event.url);
	if (!declared.includes(name)) {
		const shown = name.length > 40 ? `${name.slice(0, 40)}…` : name;
		return refuse(event, 404, `This page has no form action named “${shown}”.`);
	}
	return resolve(event);
};

/** Requests whose database failed, noted by `handleError`, answered 503 by the handle below. */
const databaseFailures = new WeakSet<object>();

/** True when `caught` is the database library's error (connection lost, busy, refused text). */
export function isDatabaseFailure(caught: unknown): boolean {
	return caught instanceof DatabaseLibraryError;
}

/** Called from `handleError`: remember that this request failed in the database. */
export function noteDatabaseFailure(event: RequestEvent): void {
	databaseFailures.add(event.locals);
}

export const DATABASE_FAILURE_MESSAGE =
	'The database could not answer just now. Please try again in a moment.';

/**
 * A request that failed in the database gets 503 with `Retry-After` instead of a 500: it is
 * not a fault in the request, and trying again later is the right advice.
 */
export const handleDatabaseFailure: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (response.status !== 500 || !databaseFailures.has(event.locals)) return response;
	if (isEndpointRoute(event.route.id)) {
		return apiError(503, DATABASE_FAILURE_MESSAGE, {}, { 'retry-after': '5' });
	}
	const headers = new Headers(response.headers);
	headers.set('retry-after', '5');
	return new Response(response.body, { status: 503, headers });
};
