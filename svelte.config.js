import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/**
 * The inline scripts of src/app.html (the theme set before first paint), allowed by their hash:
 * no `unsafe-inline` for scripts, and no `%sveltekit.nonce%` in the template, which would rule
 * out prerendering any page.
 */
const template = readFileSync(new URL('./src/app.html', import.meta.url), 'utf8');
/** @type {`sha256-${string}`[]} */
const templateScriptHashes = [...template.matchAll(/<script>([\s\S]*?)<\/script>/g)].map(
	([, body]) =>
		/** @type {`sha256-${string}`} */ (
			`sha256-${createHash('sha256').update(body).digest('base64')}`
		)
);

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter({ out: 'build' }),
		// The service worker keeps the drill usable offline; the drill page registers it, so a
		// visitor who never drills never installs it.
		serviceWorker: { register: false },
		// Kit's cross-site form check is all or nothing; hooks.server.ts runs the same check for
		// every path except the mail's one-click unsubscribe (see src/lib/server/http/cross-site.ts).
		csrf: { trustedOrigins: ['*'] },
		// Kit adds a nonce (or, on prerendered pages, a hash) for each script it writes itself.
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self', ...templateScriptHashes],
				// abcjs writes style attributes on the notation it draws; styles cannot run code.
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self', 'data:'],
				'connect-src': ['self'],
				'media-src': ['self', 'blob:', 'data:'],
				// Tone.js keeps time in a worker it builds from a blob.
				'worker-src': ['self', 'blob:'],
				'manifest-src': ['self'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		}
	}
};

export default config;
