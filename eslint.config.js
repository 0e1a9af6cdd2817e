// ESLint (flat config) for src/, test/, scripts/, bench/ and the .mjs helpers. Formatting is Prettier's job
// (.prettierrc.json); eslint-config-prettier switches off every rule that would argue with it. The rules
// chosen here catch bugs, not style: DEVELOPERS.md, "Habits", says which and why.
import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import globals from 'globals';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['dist/', 'coverage/', 'data/', 'node_modules/', 'openapi/', 'client/dist/'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node } },
    linterOptions: { reportUnusedDisableDirectives: 'error' },
    rules: {
      // `==` only against null (x == null covers undefined too); elsewhere a coercion is a bug waiting.
      eqeqeq: ['error', 'always', { null: 'ignore' }],
      'no-self-compare': 'error',
      'no-template-curly-in-string': 'error',
      'no-unreachable-loop': 'error',
      'prefer-const': ['error', { destructuring: 'all' }],
      // A focused test makes every other test of the run silently not run.
      'no-restricted-properties': [
        'error',
        ...['describe', 'it', 'test', 'bench'].map((object) => ({
          object,
          property: 'only',
          message: 'A focused test skips the rest of the suite; remove .only',
        })),
      ],
    },
  },
  {
    files: ['**/*.ts'],
    languageOptions: {
      // Type-aware rules, only those that are cheap and catch real bugs (below).
      parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname },
    },
    rules: {
      // A promise nobody awaits loses its rejection (an unhandled rejection ends the process) and its ordering.
      '@typescript-eslint/no-floating-promises': 'error',
      // An async function where a callback's return is ignored (event handlers, forEach) drops its errors.
      '@typescript-eslint/no-misused-promises': ['error', { checksVoidReturn: { arguments: true, attributes: false } }],
      '@typescript-eslint/await-thenable': 'error',
      // `${obj}` printing "[object Object]" into a message or a SQL text.
      '@typescript-eslint/no-base-to-string': 'error',
      '@typescript-eslint/only-throw-error': 'error',
      '@typescript-eslint/no-for-in-array': 'error',
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none', ignoreRestSiblings: true },
      ],
      // The code uses `!` where an index is known to exist (noUncheckedIndexedAccess); that is a choice, not a bug.
      '@typescript-eslint/no-non-null-assertion': 'off',
    },
  },
  {
    // Tests and benchmarks: assertion helpers and throwaway data are fine; `any` from JSON.parse is common there.
    files: ['test/**/*.ts', 'bench/**/*.ts'],
    rules: {
      '@typescript-eslint/no-explicit-any': 'off',
    },
  },
  prettier,
  {
    // Prettier wraps code at 140 columns but leaves comments alone; prose in strings (route descriptions,
    // messages) may run long. Re-enabled after eslint-config-prettier, which switches max-len off.
    rules: {
      'max-len': [
        'error',
        {
          code: 140,
          tabWidth: 2,
          ignoreStrings: true,
          ignoreTemplateLiterals: true,
          ignoreUrls: true,
          ignoreRegExpLiterals: true,
          // a row of a table in a doc comment (` * | a | b |`) cannot wrap
          ignorePattern: '^\\s*\\* \\|',
        },
      ],
    },
  },
);
