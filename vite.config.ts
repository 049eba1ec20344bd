import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';

/**
 * One file configures the client build (Vite) and every test suite (Vitest projects):
 * - unit: pure code beside its source, plus reference fixtures; no services needed;
 * - api: supertest against a real MariaDB started by docker-free-scripts/test.sh;
 * - e2e: Debian's Chromium driven by playwright-core against a running app;
 * - cluster: the fault test on three MariaDB Galera nodes behind HAProxy (tests/cluster/).
 */
export default defineConfig({
  root: 'client',
  publicDir: 'public',
  plugins: [react(), tailwindcss()],
  // The one way the client reaches server code: `@shared/contract/…` and `@shared/policies/…`
  // (the import-boundary check refuses any other server folder).
  resolve: { alias: { '@shared': fileURLToPath(new URL('./server', import.meta.url)) } },
  build: {
    outDir: '../dist/client',
    emptyOutDir: true,
    sourcemap: true,
  },
  server: {
    host: '127.0.0.1',
    proxy: { '/api': 'http://127.0.0.1:4310', '/auth': 'http://127.0.0.1:4310', '/healthz': 'http://127.0.0.1:4310' },
  },
  test: {
    root: '.',
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          root: '.',
          include: ['server/**/*.test.ts', 'docker-free-scripts/**/*.test.ts', 'tests/unit/**/*.test.ts', 'tests/reference/**/*.test.ts'],
          setupFiles: ['tests/property-seed.ts'],
          testTimeout: 30_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'client',
          root: '.',
          include: ['client/**/*.test.tsx', 'client/**/*.test.ts'],
          environment: 'jsdom',
          setupFiles: ['client/test-setup.ts', 'tests/property-seed.ts'],
          testTimeout: 20_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          root: '.',
          include: ['tests/api/**/*.test.ts'],
          setupFiles: ['tests/property-seed.ts'],
          testTimeout: 30_000,
          hookTimeout: 60_000,
          fileParallelism: false,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          root: '.',
          include: ['tests/e2e/**/*.test.ts'],
          testTimeout: 90_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
      {
        extends: true,
        test: {
          // A three-node Galera cluster behind HAProxy (docker-free-scripts/cluster.sh), started by the tests themselves.
          name: 'cluster',
          root: '.',
          include: ['tests/cluster/**/*.test.ts'],
          testTimeout: 300_000,
          hookTimeout: 300_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
