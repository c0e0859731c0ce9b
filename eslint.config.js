// The lint `npm test` runs before vitest. Recommended rules only, none that need type information,
// so it stays fast; the one house rule it adds is the direction of imports between the top folders.
import fs from 'node:fs';
import js from '@eslint/js';
import { createNodeResolver, importX } from 'eslint-plugin-import-x';
import { defineConfig } from 'eslint/config';
import globals from 'globals';
import tseslint from 'typescript-eslint';

/**
 * Who may import whom (DEVELOPERS.md, Layout): web → shared; server → shared, analyzers; analyzers → shared;
 * shared → nothing of the others. Tests may import anything, and nothing imports tests.
 * Zones are resolved paths, so `@/…` and `@shared/…` aliases are checked the same as relative ones.
 */
const importDirection = [
  { target: './web', from: ['./server', './analyzers', './tests'], message: 'The client imports only shared/.' },
  { target: './server', from: ['./web', './tests'], message: 'The server imports only shared/ and analyzers/.' },
  { target: './analyzers', from: ['./server', './web', './tests'], message: 'analyzers/ imports only shared/.' },
  { target: './shared', from: ['./server', './analyzers', './web', './tests'], message: 'shared/ imports nothing of the other folders.' },
];

/**
 * Inside the client: features never import each other (pages in src/app compose them), and
 * neither features nor the shared src/components and src/lib import the app; src/components and
 * src/lib import no feature.
 */
const features = fs.readdirSync(new URL('./web/src/features', import.meta.url), { withFileTypes: true }).filter((d) => d.isDirectory()).map((d) => d.name);
const clientLayers = [
  ...features.map((feature) => ({
    target: `./web/src/features/${feature}`,
    from: './web/src/features',
    except: [`./${feature}`],
    message: 'Features do not import each other; compose them in a page under src/app.',
  })),
  { target: './web/src/features', from: './web/src/app', message: 'Features do not import the app.' },
  { target: ['./web/src/components', './web/src/lib'], from: ['./web/src/app', './web/src/features'], message: 'Shared UI and helpers import no app or feature code.' },
];

export default defineConfig(
  { ignores: ['node_modules/', 'dist/', '.data/', 'test-results/', 'tests/fixtures/'] },
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx,js,mjs}'],
    plugins: { 'import-x': importX },
    settings: {
      'import-x/resolver-next': [
        createNodeResolver({
          extensions: ['.ts', '.tsx', '.js', '.mjs', '.json'],
          tsconfig: { configFile: './tsconfig.json' },
        }),
      ],
    },
    rules: {
      'import-x/no-restricted-paths': ['error', { basePath: import.meta.dirname, zones: [...importDirection, ...clientLayers] }],
      // `_name` marks a parameter kept for its position in a signature (callbacks, overloads).
      // Errors are re-thrown with a clear message of their own on purpose: a cause may carry the
      // user's source text, which must never reach a log.
      'preserve-caught-error': 'off',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
    },
  },
  { files: ['**/*.{ts,tsx,js,mjs}'], ignores: ['web/**'], languageOptions: { globals: globals.node } },
  // The client runs in the browser; its tests (jsdom) and the browser tests (page callbacks) see both.
  { files: ['web/**/*.{ts,tsx}'], languageOptions: { globals: globals.browser } },
  {
    files: ['web/**/*.{ts,tsx}', 'tests/web/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [{ regex: '^\\.\\./', message: 'Import through @/ (web/src) or @shared/ (shared) instead of a parent path.' }],
      }],
    },
  },
  { files: ['tests/web/**', 'tests/e2e/**'], languageOptions: { globals: globals.browser } },
);
