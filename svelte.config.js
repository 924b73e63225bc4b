import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

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
		csrf: { trustedOrigins: ['*'] }
	}
};

export default config;
