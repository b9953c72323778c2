// ESLint flat config: typescript-eslint, eslint-plugin-svelte, and import-x/no-cycle (any circle fails).
import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import importX from 'eslint-plugin-import-x';
import svelte from 'eslint-plugin-svelte';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

// zod comes configured from src/lib/zod.ts (no code generation in the browser, where the CSP forbids eval).
const zodOnce = {
	name: 'zod',
	message: "Import z from '$lib/zod', which configures zod once for browser and server."
};

export default ts.config(
	{
		ignores: [
			'build/',
			'build-*/',
			'.svelte-kit/',
			'.svelte-kit-*/',
			'node_modules/',
			'test-results/',
			'playwright-report/',
			'drizzle/',
			'content/'
		]
	},
	js.configs.recommended,
	...ts.configs.recommended,
	...svelte.configs.recommended,
	prettier,
	...svelte.configs.prettier,
	{
		languageOptions: { globals: { ...globals.browser, ...globals.node } }
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
		plugins: { 'import-x': importX },
		settings: {
			'import-x/resolver-next': [createTypeScriptImportResolver({ project: './tsconfig.json' })],
			'import-x/extensions': ['.ts', '.js', '.svelte'],
			// Imported modules are read with the parser for their own kind, whatever file imports them.
			'import-x/parsers': {
				'@typescript-eslint/parser': ['.ts', '.js'],
				'svelte-eslint-parser': ['.svelte']
			}
		},
		rules: {
			// Type imports count: a circle of types is still a circle of modules to read.
			'import-x/no-cycle': ['error', { ignoreExternal: true }]
		}
	},
	// Which may import which (DEVELOPERS.md, "Map of the house").
	{
		files: ['src/**/*.ts', 'src/**/*.svelte'],
		ignores: ['src/**/*.test.ts', 'src/lib/testing/**', 'src/lib/zod.ts'],
		rules: {
			'no-restricted-imports': [
				'error',
				{
					paths: [zodOnce],
					patterns: [
						{
							group: ['$lib/testing/*', '**/testing/*'],
							message: 'Test helpers stay out of production code.'
						}
					]
				}
			]
		}
	},
	{
		files: ['src/lib/rf/**/*.ts'],
		ignores: ['src/lib/rf/**/*.test.ts'],
		rules: {
			'no-restricted-imports': [
				'error',
				{
					paths: [zodOnce],
					patterns: [
						{
							group: [
								'$app/*',
								'@sveltejs/*',
								'$lib/server/*',
								'**/server/*',
								'$lib/components/*',
								'$env/*',
								'$lib/schemas/*',
								'**/schemas/*'
							],
							message: 'rf is plain TypeScript: no framework, server, UI or schema imports.'
						}
					]
				}
			]
		}
	},
	{
		files: ['src/routes/**/*.ts', 'src/routes/**/*.svelte'],
		rules: {
			'no-restricted-imports': [
				'error',
				{
					paths: [
						zodOnce,
						{ name: '$lib/server/db', message: 'Routes call server modules, never the database.' }
					],
					patterns: [
						{
							// db/busy touches no table: retryBusy wraps a server call in bounded retries.
							group: ['$lib/server/db/*', '!$lib/server/db/busy', 'drizzle-orm', 'drizzle-orm/*'],
							message: 'Routes call server modules, never the database.'
						},
						{ group: ['$lib/testing/*'], message: 'Test helpers stay out of production code.' }
					]
				}
			]
		}
	},
	{
		rules: {
			'@typescript-eslint/no-unused-vars': [
				'error',
				{ argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' }
			],
			// Tests and bench keep regexes with control characters on purpose (binary and header checks).
			'no-control-regex': 'off',
			// The app is served at the root (no paths.base), so links are plain absolute paths.
			'svelte/no-navigation-without-resolve': 'off',
			// The URL and URLSearchParams flagged here are built and read at once, never kept as state.
			'svelte/prefer-svelte-reactivity': 'off'
		}
	}
);
