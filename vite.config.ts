import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

// One config for the client build and the test runner. Test projects mirror the source tree:
// node for shared/server/workers/scripts, jsdom for the client, and e2e (built app + Chromium).
export default defineConfig({
  plugins: [react(), tailwindcss()],
  build: { outDir: 'dist/client', emptyOutDir: true, chunkSizeWarningLimit: 2000 },
  server: { proxy: { '/api': 'http://127.0.0.1:3000' } },
  test: {
    reporters: ['default', './tests/setup/summary-reporter.ts'],
    projects: [
      {
        extends: true,
        test: {
          name: 'shared',
          environment: 'node',
          include: ['tests/shared/**/*.test.ts', 'tests/scripts/**/*.test.ts'],
          // Signal tests run whole pipelines on generated captures: seconds each on a busy 2-core machine.
          testTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'server',
          environment: 'node',
          include: ['tests/server/**/*.test.ts', 'tests/workers/**/*.test.ts'],
          globalSetup: ['tests/setup/global-db.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 120_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'client',
          environment: 'jsdom',
          include: ['tests/src/**/*.test.{ts,tsx}'],
          setupFiles: ['tests/setup/client.ts'],
          // jsdom renders of whole pages take seconds on a busy machine.
          testTimeout: 30_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/setup/global-db.ts'],
          fileParallelism: false,
          testTimeout: 240_000, // whole-job walks take minutes on a busy machine
          hookTimeout: 180_000,
        },
      },
    ],
  },
});
