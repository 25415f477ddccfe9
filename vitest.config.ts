// Vitest configuration: one runner for unit, API (real PostgreSQL) and browser tests.
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    environment: 'node',
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: 'forks',
    maxWorkers: 2,
    // Each worker process keeps its imported modules from one test file to the next: importing
    // the API and its libraries again for each of ~100 files cost about 40 s of the run
    // on two cores. Every file builds its own data (its own network) and closes what it opened;
    // the fault tests, which stop PostgreSQL and servers, still run isolated (scripts/test.mjs).
    isolate: false,
    setupFiles: ['tests/setup/env.ts'],
    globalSetup: ['tests/setup/global-server.ts'],
  },
});
