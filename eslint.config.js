// ESLint flat config: typescript-eslint, eslint-plugin-svelte, and import-x/no-cycle (any circle fails).
import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import importX from 'eslint-plugin-import-x';
import svelte from 'eslint-plugin-svelte';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
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
