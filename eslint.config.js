// ESLint for the whole repository: the recommended JavaScript, TypeScript (type-aware, so that
// floating promises are caught) and Svelte 5 rules; Prettier owns the layout (eslint-config-prettier
// turns off every rule that would fight it). `npm run lint` runs Prettier's check, then this.
import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import svelte from 'eslint-plugin-svelte';
import { defineConfig, globalIgnores } from 'eslint/config';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

export default defineConfig(
	globalIgnores([
		'build/',
		'build-bench/',
		'.svelte-kit/',
		'test-results/',
		'.data/',
		'static/',
		'drizzle/',
		'src/lib/trade/label-font.ts'
	]),
	js.configs.recommended,
	ts.configs.recommended,
	svelte.configs.recommended,
	prettier,
	svelte.configs.prettier,
	{
		languageOptions: {
			globals: { ...globals.browser, ...globals.node },
			parserOptions: {
				// One TypeScript program for .ts and .svelte alike (tsconfig.json); the few files it
				// does not include (the plain-Node bootstrap scripts, the benches) get a default one.
				projectService: { allowDefaultProject: ['scripts/*.mjs', 'bench/*.ts'] },
				tsconfigRootDir: import.meta.dirname,
				extraFileExtensions: ['.svelte']
			}
		}
	},
	{
		files: ['**/*.svelte', '**/*.svelte.ts', '**/*.svelte.js'],
		languageOptions: { parserOptions: { parser: ts.parser, svelteConfig } },
		// What typescript-eslint turns off for .ts files because the compiler already checks it
		// (no-undef, no-import-assign, …) holds for a Svelte component's TypeScript too: svelte-check
		// compiles it. Left on, no-import-assign misreads `export type { X }` beside `import { type X }`.
		// Only the rules it turns off: its prefer-const would flag `let { … } = $props()`, Svelte's own idiom.
		rules: Object.fromEntries(Object.entries(ts.configs.eslintRecommended.rules ?? {}).filter(([, level]) => level === 'off'))
	},
	{
		rules: {
			// The point of the type-aware set-up: a promise nobody awaits loses its errors. `void p`
			// says on purpose.
			'@typescript-eslint/no-floating-promises': 'error',
			// `_name` marks a parameter or destructured value kept for its position or to leave it out.
			'@typescript-eslint/no-unused-vars': [
				'error',
				{ argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_', ignoreRestSiblings: true }
			],
			// Turned off because they only fight the house style:
			// - Hostile-input checks match control characters on purpose (names, file names, headers).
			'no-control-regex': 'off',
			// - The app is served at the root (no paths.base), so resolve() around every href and
			//   replaceState would change nothing; addresses are built from strings and query helpers.
			'svelte/no-navigation-without-resolve': 'off',
			// - Every URL / URLSearchParams it flags is a throwaway builder inside an effect, a timer or a
			//   derived value, never state; SvelteURL would only add tracking nobody reads.
			'svelte/prefer-svelte-reactivity': 'off',
			// - `{' '}` and `{' · '}` pin the whitespace between inline elements so that formatting the
			//   markup cannot drop or add a space.
			'svelte/no-useless-mustaches': 'off'
		}
	}
);
