import js from '@eslint/js';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

export default ts.config(
	{
		ignores: [
			'build/',
			'.svelte-kit/',
			'node_modules/',
			'.data/',
			'test-results/',
			'playwright-report/',
			'migrations/',
			'seeders/'
		]
	},
	js.configs.recommended,
	...ts.configs.recommended,
	...svelte.configs.recommended,
	{
		languageOptions: { globals: { ...globals.browser, ...globals.node } }
	},
	{
		files: ['**/*.ts', '**/*.svelte', '**/*.svelte.ts'],
		languageOptions: {
			parserOptions: {
				projectService: {
					allowDefaultProject: [
						'src/service-worker.ts',
						'vitest.integration.config.ts',
						'scripts/*.ts',
						'scripts/bench/*.ts'
					],
					// The scripts and configs above are more than the default limit of 8 files.
					maximumDefaultProjectFileMatchCount_THIS_WILL_SLOW_DOWN_LINTING: 16
				},
				extraFileExtensions: ['.svelte'],
				parser: ts.parser,
				svelteConfig
			}
		},
		rules: {
			'@typescript-eslint/no-floating-promises': 'error',
			'@typescript-eslint/no-misused-promises': 'error',
			'@typescript-eslint/no-unused-vars': [
				'error',
				{ argsIgnorePattern: '^_', varsIgnorePattern: '^_' }
			]
		}
	},
	{
		// Routes only call services: the database is the services' (a route may open the
		// transaction that its services' writes share, and name a model's type).
		files: ['src/routes/**/*.ts'],
		rules: {
			'@typescript-eslint/no-restricted-imports': [
				'error',
				{
					paths: [
						{
							name: '$lib/server/db',
							allowImportNames: ['sequelize'],
							allowTypeImports: true,
							message: 'Routes call services; put the read or write in a service of src/lib/server.'
						}
					],
					patterns: [
						{
							group: ['$lib/server/db/*'],
							allowTypeImports: true,
							message: 'Routes call services; put the read or write in a service of src/lib/server.'
						}
					]
				}
			],
			'no-restricted-syntax': [
				'error',
				{
					selector: "MemberExpression[object.name='sequelize'][property.name!='transaction']",
					message: 'Routes only open transactions; queries belong in a service.'
				}
			]
		}
	},
	{
		files: ['**/*.svelte'],
		rules: {
			// Links inside the app are plain paths; SvelteKit resolves them.
			'svelte/no-navigation-without-resolve': 'off'
		}
	}
);
