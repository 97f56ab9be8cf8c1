import { defineConfig } from 'vitest/config';

// `npm run test:faults`: the longer fault tests (issue 19 item 7), each on its own MariaDB and its
// own built server process, outside `npm test`'s budget. `.ci/run` runs them after `npm test`.
export default defineConfig({
  test: {
    name: 'faults',
    reporters: ['default', './tests/setup/summary-reporter.ts'],
    environment: 'node',
    include: ['tests/faults/**/*.test.ts'],
    fileParallelism: false,
    testTimeout: 240_000,
    hookTimeout: 240_000,
  },
});
