// Lint rules. The one that matters most: core/ stays pure (no I/O, no DOM,
// no framework), so server and client can both run it.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import globals from 'globals';

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'data/**', 'test-artifacts/**', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-explicit-any': 'error',
    },
  },
  {
    files: ['core/**/*.ts'],
    languageOptions: { globals: { ...globals['shared-node-browser'] } },
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [
          { group: ['**/server/**', '**/client/**', '../server/*', '../client/*'], message: 'core/ must not import from server/ or client/.' },
          { group: ['express', 'better-sqlite3', 'pg', 'chart.js', 'chart.js/*', 'node:*', 'fs', 'path', 'http'], message: 'core/ is pure: no I/O, framework or DOM libraries.' },
        ],
      }],
      'no-restricted-globals': ['error', 'document', 'window', 'localStorage', 'indexedDB', 'fetch', 'process'],
    },
  },
);
