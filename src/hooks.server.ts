import {
	error,
	redirect,
	type Handle,
	type HandleServerError,
	type ServerInit
} from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { building, dev } from '$app/environment';
import { migrate } from '$lib/server/db/migrate';
import { startMail, stopMail } from '$lib/server/mail';
import { jobsSettled } from '$lib/server/jobs';
import { closeDb } from '$lib/server/db';
import { startDigestScheduler, stopDigestScheduler } from '$lib/server/digest/scheduler';
import { refuseCrossSiteForm } from '$lib/server/http/cross-site';
import { signInUrl } from '$lib/server/auth/redirects';
import { refuseNonAdmin } from '$lib/server/admin/api';
import {
	DATABASE_FAILURE_MESSAGE,
	handleActionNames,
	handleDatabaseFailure,
	handleRequestOrigin,
	handleSecurityHeaders,
	handleTextFields,
	isDatabaseFailure,
	noteDatabaseFailure
} from '$lib/server/http/edge';
import { isPageRoute } from '$lib/server/http/routes';
import {
	deleteSessionCookie,
	readSessionToken,
	setSessionCookie,
	validateSessionToken
} from '$lib/server/auth/session';

/** Once per server start (never during `vite build`): bring the schema up to date, start mail. */
export const init: ServerInit = async () => {
	if (building) return;
	await migrate();
	await startMail();
	// The scheduled mails run in this process, off the request path (see digest/scheduler.ts).
	startDigestScheduler();
	// adapter-node emits this after SIGTERM/SIGINT once requests have drained; the SMTP stand-in,
	// the mail job and the database handle would otherwise keep the process alive.
	process.once('sveltekit:shutdown', () => {
		// Queued mails (reset links) get a few seconds to go out before mail stops.
		void stopDigestScheduler()
			.then(() => jobsSettled(10_000))
			.then(stopMail)
			.then(closeDb);
	});
};

/**
 * Cross-site form posts are refused here rather than by Kit (svelte.config.js), so that the
 * mail's one-click unsubscribe can be exempt; like Kit's, only outside the dev server.
 */
export const handleCrossSiteForms: Handle = async ({ event, resolve }) => {
	if (!dev) {
		const refused = refuseCrossSiteForm(event.request, event.url);
		if (refused) return refused;
	}
	return resolve(event);
};

/** Who is asking: the session cookie's token looked up (hashed) in the database. */
export const handleSession: Handle = async ({ event, resolve }) => {
	const token = readSessionToken(event.cookies);
	if (!token) {
		event.locals.user = null;
		event.locals.session = null;
		return resolve(event);
	}
	const { user, session } = await validateSessionToken(token);
	if (session?.fresh) setSessionCookie(event.cookies, token, session.expiresAt);
	if (!session) deleteSessionCookie(event.cookies);
	event.locals.user = user;
	event.locals.session = session;
	return resolve(event);
};

/** What the role gate says about a page route for this user, before any page code runs. */
function pageGate(id: string, user: App.Locals['user']): 'sign-in' | string | null {
	const needs = id.startsWith('/(admin)')
		? 'admin'
		: id.startsWith('/(teach)')
			? 'teacher'
			: id.startsWith('/(learn)')
				? 'learner'
				: null;
	if (!needs) return null;
	if (!user) return 'sign-in';
	if (needs === 'admin' && user.role !== 'admin') return 'This page is for admins.';
	if (needs === 'teacher' && user.role !== 'teacher' && user.role !== 'admin') {
		return 'This page is for teachers.';
	}
	return null;
}

/**
 * Role gates by route group. Route ids keep the group name, so `/(teach)/…` covers every page
 * of the group whichever layout or load runs. Endpoints under /api check roles themselves too.
 *
 * A refused page opened in the browser is still rendered, so that the refusal shows in the site
 * shell with a way back: the group's layout load (and each page's own `requireRole`) throws the
 * 403 inside the app. The gate stays the boundary: unless the answer is that 403, nothing of the
 * page is sent. Form posts and data requests are refused here outright.
 */
export const handleRoleGate: Handle = async ({ event, resolve }) => {
	const id = event.route.id ?? '';
	if (id.startsWith('/api/admin')) {
		const refused = refuseNonAdmin(event.locals);
		if (refused) return refused;
		return resolve(event);
	}
	const gate = pageGate(id, event.locals.user);
	if (gate === null) return resolve(event);
	if (gate === 'sign-in') redirect(303, signInUrl(event.url));
	const method = event.request.method;
	if ((method === 'GET' || method === 'HEAD') && !event.isDataRequest && isPageRoute(id)) {
		const response = await resolve(event);
		if (response.status === 403) return response;
		await response.body?.cancel();
	}
	error(403, gate);
};

export const handle = sequence(
	handleSecurityHeaders,
	handleDatabaseFailure,
	handleCrossSiteForms,
	handleRequestOrigin,
	handleTextFields,
	handleActionNames,
	handleSession,
	handleRoleGate
);

/** Unexpected errors: logged in full here, a plain sentence for the person who hit them. */
export const handleError: HandleServerError = ({ error: caught, event, status, message }) => {
	// Below 500 the request was at fault (no such page, a wrong method, a JSON body sent to a form
	// action): Kit's short text ("Unsupported Media Type") says so, and there is no fault to log.
	if (status < 500) return { message };
	console.error(`[${event.request.method} ${event.url.pathname}]`, caught);
	// A database that fails is no fault of the request: `handleDatabaseFailure` answers 503.
	if (isDatabaseFailure(caught)) {
		noteDatabaseFailure(event);
		return { message: DATABASE_FAILURE_MESSAGE, status: 503 };
	}
	return { message: 'Something went wrong on our side. Please try again in a moment.' };
};
