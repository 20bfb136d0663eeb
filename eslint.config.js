import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

export default ts.config(
	{
		ignores: [
			'build/',
			'build-*/',
			'.svelte-kit/',
			'.svelte-kit-*/',
			'.data/',
			'drizzle/',
			'test-results/',
			'playwright-report/'
		]
	},
	js.configs.recommended,
	...ts.configs.recommended,
	...svelte.configs.recommended,
	prettier,
	...svelte.configs.prettier,
	{
		languageOptions: { globals: { ...globals.browser, ...globals.node } },
		rules: {
			// TypeScript itself reports undefined names more precisely.
			'no-undef': 'off',
			'@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_' }]
		}
	},
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
		// Type-aware guards against promises nobody awaits or that land where a void callback is
		// expected (an unhandled rejection, an event handler that returns before its work).
		files: ['src/**/*.ts', 'src/**/*.svelte', 'tests/**/*.ts'],
		languageOptions: {
			parserOptions: {
				projectService: true,
				extraFileExtensions: ['.svelte'],
				tsconfigRootDir: import.meta.dirname
			}
		},
		rules: {
			'@typescript-eslint/no-floating-promises': 'error',
			'@typescript-eslint/no-misused-promises': 'error'
		}
	},
	{
		// Routes stay thin: they call services and never reach the database themselves.
		files: ['src/routes/**'],
		rules: {
			'no-restricted-imports': [
				'error',
				{
					paths: [{ name: 'drizzle-orm', message: 'Routes call services; only services query.' }],
					patterns: [
						{
							group: ['drizzle-orm/*', '$lib/server/db', '$lib/server/db/*', '**/server/db/**'],
							message: 'Routes call services in $lib/server/<domain>; only services query.'
						}
					]
				}
			]
		}
	}
);
