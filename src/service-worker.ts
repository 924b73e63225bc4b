/// <reference types="@sveltejs/kit" />
/// <reference no-default-lib="true"/>
/// <reference lib="esnext" />
/// <reference lib="webworker" />
/**
 * Keeps the drill usable without a network: the app's built files (so the drill page, abcjs and
 * Tone load offline) and the drill's page and today's prompts, refreshed whenever the network
 * answers. Everything else goes to the network untouched. Grades never pass through here: the
 * drill page keeps them in IndexedDB and sends them itself.
 */
import { build, files, version } from '$service-worker';
import {
	DRILL_CACHE,
	KEPT_COPY_HEADER,
	SHELL_CACHE_PREFIX,
	isDrillPath,
	isSignOut
} from '$lib/drill/offline-cache';

const sw = self as unknown as ServiceWorkerGlobalScope;
const SHELL = `${SHELL_CACHE_PREFIX}${version}`;
const ASSETS = new Set([...build, ...files]);

sw.addEventListener('install', (event) => {
	event.waitUntil(
		caches
			.open(SHELL)
			.then((cache) => cache.addAll([...ASSETS]))
			.then(() => sw.skipWaiting())
	);
});

sw.addEventListener('activate', (event) => {
	event.waitUntil(
		(async () => {
			for (const key of await caches.keys()) {
				if (key.startsWith(SHELL_CACHE_PREFIX) && key !== SHELL) await caches.delete(key);
			}
			await sw.clients.claim();
		})()
	);
});

/** Network first; a good answer refreshes the copy, a failed network falls back to it. */
async function networkFirst(request: Request): Promise<Response> {
	const cache = await caches.open(DRILL_CACHE);
	try {
		const response = await fetch(request);
		// Only a real page or answer is kept: never a redirect to sign-in or an error.
		if (response.ok && !response.redirected && response.type === 'basic') {
			await cache.put(request, response.clone());
		}
		return response;
	} catch (err) {
		const copy = await cache.match(request, { ignoreSearch: true });
		if (!copy) throw err;
		// Marked, so that the page can say it is offline.
		const headers = new Headers(copy.headers);
		headers.set(KEPT_COPY_HEADER, '1');
		return new Response(copy.body, { status: copy.status, statusText: copy.statusText, headers });
	}
}

sw.addEventListener('fetch', (event) => {
	const url = new URL(event.request.url);
	if (url.origin !== sw.location.origin) return;
	if (isSignOut(event.request.method, url.pathname)) {
		event.waitUntil(caches.delete(DRILL_CACHE));
		return;
	}
	if (event.request.method !== 'GET') return;
	if (ASSETS.has(url.pathname)) {
		event.respondWith(
			caches
				.open(SHELL)
				.then((cache) => cache.match(url.pathname))
				.then((hit) => hit ?? fetch(event.request))
		);
		return;
	}
	if (isDrillPath(url.pathname)) event.respondWith(networkFirst(event.request));
});
