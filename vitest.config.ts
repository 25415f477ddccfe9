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
    setupFiles: ['tests/setup/env.ts'],
    globalSetup: ['tests/setup/global-server.ts'],
  },
});
