import { availableParallelism } from 'node:os';
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    // Limits against hangs only (no test may depend on speed): above the limit of one CLI child
    // (tests/integration/cli.ts), so a killed child is reported with its signal first.
    testTimeout: 30 * 60_000,
    hookTimeout: 30 * 60_000,
    pool: 'forks',
    // Every core (the default leaves one free): most files are CPU-bound in-process, and the CLI
    // children of the integration files are short.
    maxWorkers: availableParallelism(),
  },
});
