import path from 'node:path';
import { fileURLToPath } from 'node:url';
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

const root = path.dirname(fileURLToPath(import.meta.url));
const apiPort = process.env.PORT ?? '3030';

/** One config for the client build (root: web/), the dev server, and vitest (whole checkout). */
export default defineConfig({
  root: path.join(root, 'web'),
  plugins: [react(), tailwindcss()],
  // The client's import aliases; tsconfig.json's `paths` says the same to tsc and the lint.
  resolve: {
    alias: [
      { find: /^@\//, replacement: `${path.join(root, 'web', 'src')}/` },
      { find: /^@shared\//, replacement: `${path.join(root, 'shared')}/` },
    ],
  },
  build: { outDir: path.join(root, 'dist', 'web'), emptyOutDir: true },
  server: {
    host: '127.0.0.1',
    proxy: { '/api': `http://127.0.0.1:${apiPort}` },
  },
  test: {
    dir: path.join(root, 'tests'),
    include: ['**/*.test.ts', '**/*.test.tsx'],
    environment: 'node',
    pool: 'forks',
    testTimeout: 30_000,
    hookTimeout: 120_000,
  },
});
