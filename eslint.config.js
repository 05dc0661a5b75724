// ESLint's settings for the whole repository (`npm run lint`, part of `npm test`): the
// recommended JavaScript and typescript-eslint rules, and one import order everywhere
// (eslint-plugin-simple-import-sort; `npx eslint --fix .` puts imports in that order).
//
// The rules are the syntactic ones, not typescript-eslint's type-aware set: on this repository
// the type-aware set takes about 45 s and 1.6 GB instead of about 12 s and 0.4 GB, and most of
// what it adds flags values read from parsed JSON in tests, while `npm run typecheck` already
// runs the compiler over every part.
import js from '@eslint/js';
import { defineConfig } from 'eslint/config';
import simpleImportSort from 'eslint-plugin-simple-import-sort';
import tseslint from 'typescript-eslint';

export default defineConfig(
  {
    ignores: [
      'node_modules/**',
      'dist/**',
      'test-output/**',
      'datasets/**',
      'out/**',
      'models/**',
      'predictions/**',
      '.pliant-cache/**',
      // AssemblyScript, compiled by asc with its own types (i32, f64, load<T>); not TypeScript.
      'sim/core/wasm/assembly/**',
    ],
  },
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    plugins: { 'simple-import-sort': simpleImportSort },
    rules: {
      'simple-import-sort/imports': 'error',
      'simple-import-sort/exports': 'error',
      // A leading underscore marks a name kept on purpose: a parameter an interface requires, or a
      // field dropped by destructuring (`const { run: _run, ...rest } = manifest`).
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_', ignoreRestSiblings: true },
      ],
    },
  },
  {
    // Tests edit fixtures and read parsed JSON freely (deliberately malformed scenarios, tampered
    // manifests); typing every such value would add noise and catch nothing.
    files: ['test/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  {
    // The few plain .mjs files are Node entry points (workers, launcher, build scripts).
    files: ['**/*.mjs', '**/*.js'],
    languageOptions: {
      globals: {
        console: 'readonly',
        process: 'readonly',
        performance: 'readonly',
        URL: 'readonly',
        Buffer: 'readonly',
        setTimeout: 'readonly',
        clearTimeout: 'readonly',
      },
    },
  },
);
