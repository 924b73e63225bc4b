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
					testTimeout: 30_000,
					hookTimeout: 60_000
				}
			}
		]
	}
});
