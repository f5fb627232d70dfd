// Lint rules that keep the architecture true: shared/ imports neither server/ nor src/, and
// server/ and src/ never import each other. Everything else is left to TypeScript.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import importPlugin from 'eslint-plugin-import';

// clipper2-js is used through shared/engine/clipper.ts, which repairs a bug of the port.
const clipperOnlyThroughRepair = { name: 'clipper2-js', message: 'Import Clipper from shared/engine/clipper.ts (it carries a repair).' };

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'data/**', '.tmp/**', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx}'],
    plugins: { import: importPlugin },
    settings: { 'import/resolver': { node: { extensions: ['.ts', '.tsx', '.js'] } } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-explicit-any': 'off',
      '@typescript-eslint/no-non-null-assertion': 'off',
      'no-restricted-imports': ['error', { paths: [clipperOnlyThroughRepair] }],
      'import/no-restricted-paths': [
        'error',
        {
          zones: [
            { target: './shared', from: './server', message: 'shared/ is pure: it must not import server/.' },
            { target: './shared', from: './src', message: 'shared/ is pure: it must not import src/.' },
            { target: './server', from: './src', message: 'server/ and src/ never import each other.' },
            { target: './src', from: './server', message: 'server/ and src/ never import each other.' },
          ],
        },
      ],
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: [clipperOnlyThroughRepair],
          patterns: [
            { group: ['node:*', 'fs', 'path', 'os', 'child_process', 'worker_threads'], message: 'shared/ has no Node APIs.' },
          ],
        },
      ],
    },
  },
  {
    files: ['shared/engine/clipper.ts'],
    rules: { 'no-restricted-imports': 'off' },
  },
  {
    files: ['**/*.{js,mjs}'],
    languageOptions: { globals: { process: 'readonly', console: 'readonly', URL: 'readonly', setTimeout: 'readonly', clearTimeout: 'readonly' } },
  },
);
