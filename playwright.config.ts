import { defineConfig } from '@playwright/test';
import { E2E_DATA_DIR, E2E_ORIGIN, E2E_PORT } from './tests/e2e/support/env';

/**
 * End-to-end tests drive the BUILT server (`vite build` first; `npm run test:e2e` does both) in
 * Debian's Chromium: Playwright never downloads a browser here.
 */
export default defineConfig({
	testDir: 'tests/e2e',
	// The README screenshots rewrite tracked files: only on request (`SCREENSHOTS=1`).
	testIgnore: process.env.SCREENSHOTS ? [] : ['**/screenshots.spec.ts'],
	fullyParallel: false,
	workers: 1,
	retries: 0,
	// `npm test` asks for a JSON report too, to total every suite in one closing line.
	reporter: process.env.PLAYWRIGHT_JSON_OUTPUT_NAME ? [['list'], ['json']] : 'list',
	// Generous for two loaded cores; a passing test takes seconds.
	timeout: 60_000,
	expect: { timeout: 7_000 },
	use: {
		baseURL: E2E_ORIGIN,
		viewport: { width: 1280, height: 800 },
		launchOptions: {
			executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
			args: [
				'--no-sandbox',
				'--disable-gpu',
				'--disable-quic',
				'--no-first-run',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync'
			]
		}
	},
	webServer: {
		command: 'node tests/e2e/support/serve.mjs',
		url: `${E2E_ORIGIN}/`,
		reuseExistingServer: false,
		timeout: 60_000,
		stdout: 'pipe',
		stderr: 'pipe',
		env: {
			PORT: String(E2E_PORT),
			ORIGIN: E2E_ORIGIN,
			DATA_DIR: E2E_DATA_DIR,
			DEMO_PASSWORD: 'demo-password-12',
			// Every test signs up fresh accounts from one address; the suite already needs close to
			// the 30 sign-ups an hour one address may make. The limits themselves are covered by the
			// integration tests, so here they are scaled out of the way.
			AUTH_LIMIT_SCALE: '20'
		}
	}
});
