import tailwindcss from '@tailwindcss/vite';
import { sveltekit } from '@sveltejs/kit/vite';
// `defineConfig` from vitest/config: svelte-check rejects the `test` key on vite's own.
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	test: {
		expect: { requireAssertions: true },
		projects: [
			{
				extends: './vite.config.ts',
				test: {
					name: 'unit',
					environment: 'node',
					// The first test of a file pays for importing the engine; on two loaded cores (the
					// whole suite runs files in parallel, beside a server build) that can pass 5 s.
					testTimeout: 30_000,
					include: ['tests/unit/**/*.test.ts'],
					setupFiles: ['tests/unit/setup.ts']
				}
			},
			{
				// Component logic: the small modules beside the components, and their markup rendered
				// by Svelte (no browser needed).
				extends: './vite.config.ts',
				test: {
					name: 'client',
					environment: 'node',
					testTimeout: 30_000,
					include: ['tests/client/**/*.test.ts']
				}
			},
			{
				extends: './vite.config.ts',
				test: {
					name: 'integration',
					environment: 'node',
					include: ['tests/integration/**/*.test.ts'],
					// Each file gets its own SQLite file and SMTP port; files run in parallel processes.
					// Generous: files run in parallel with a server build and a load test on two cores,
					// and the first test of a file pays for importing the routes it drives.
					testTimeout: 90_000,
					hookTimeout: 180_000
				}
			}
		]
	}
});
