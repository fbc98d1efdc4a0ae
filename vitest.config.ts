import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    // one temporary folder per run, removed at its end (test/support/global-temp.ts)
    globalSetup: ['test/support/global-temp.ts'],
    testTimeout: 120_000,
    hookTimeout: 120_000,
    pool: 'forks',
    // Two test files at a time: vitest's default leaves a core to the main process, which only
    // collects results here, so the suite ran one file at a time on this 2-core machine.
    maxWorkers: 2,
  },
});
