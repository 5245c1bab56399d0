import { defineConfig } from 'vitest/config';

// Three projects: pure engine tests run in parallel; API and browser tests share one MariaDB
// database and one server, so their files run one after another.
export default defineConfig({
  test: {
    reporters: ['default'],
    projects: [
      {
        test: {
          name: 'core',
          include: ['test/core/**/*.test.ts', 'test/scripts/**/*.test.ts'],
          environment: 'node',
          testTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'api',
          include: ['test/api/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['test/support/db-global-setup.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['test/e2e/**/*.spec.ts'],
          environment: 'node',
          globalSetup: ['test/support/db-global-setup.ts', 'test/support/e2e-global-setup.ts'],
          fileParallelism: false,
          testTimeout: 120_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
