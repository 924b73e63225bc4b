import js from '@eslint/js';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

/**
 * Layers (DEVELOPERS.md "Layout"): the domain core and the form schemas are pure, so they import
 * no framework, no database and nothing server-only; components never reach into routes.
 * `tests/unit/lint/layers.test.ts` proves that a violation fails `npm run lint`.
 */
const PURE =
	'is pure (time, randomness and storage are passed in): keep framework and server code out.';
const pureLayers = {
	patterns: [
		{ group: ['@sveltejs/kit', '@sveltejs/kit/*'], message: `Kit: this layer ${PURE}` },
		{ group: ['$app/*'], message: `$app: this layer ${PURE}` },
		{ group: ['$env/*'], message: `$env: this layer ${PURE}; configuration is read in config.ts.` },
		{ group: ['sequelize', 'sequelize/*'], message: `Sequelize: this layer ${PURE}` },
		{
			group: ['$lib/server', '$lib/server/*', '**/server', '**/server/*'],
			message: `Server code: this layer ${PURE}`
		}
	]
};
const noRoutes = {
	patterns: [
		{
			group: ['**/routes', '**/routes/*', '$routes/*'],
			message: 'Components never import from routes: move what both need into $lib.'
		}
	]
};

export default ts.config(
	js.configs.recommended,
	...ts.configs.recommended,
	...svelte.configs.recommended,
	{ languageOptions: { globals: { ...globals.browser, ...globals.node } } },
	{
		files: ['**/*.svelte', '**/*.svelte.ts', '**/*.svelte.js'],
		languageOptions: {
			parserOptions: {
				projectService: true,
				extraFileExtensions: ['.svelte'],
				parser: ts.parser,
				svelteConfig
			}
		}
	},
	{
		rules: {
			'@typescript-eslint/no-unused-vars': [
				'error',
				{ argsIgnorePattern: '^_', varsIgnorePattern: '^_' }
			]
		}
	},
	{
		files: ['src/lib/music/**', 'src/lib/practice/**', 'src/lib/forms/**'],
		rules: { 'no-restricted-imports': ['error', pureLayers] }
	},
	{
		files: ['src/lib/components/**'],
		rules: { 'no-restricted-imports': ['error', noRoutes] }
	},
	{
		ignores: [
			'build/',
			'.svelte-kit/',
			'node_modules/',
			'data/',
			'test-results/',
			'tmp/',
			'playwright-report/'
		]
	}
);
