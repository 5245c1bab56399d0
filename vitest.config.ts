import { defineConfig } from 'vitest/config';

// Three projects, run one after another (groupOrder): pure engine tests in parallel files; API and
// browser tests share one MariaDB test database, so their files run one at a time and the browser
// tests (which change demo people's roles) never overlap the API tests.
export default defineConfig({
  test: {
    reporters: ['default'],
    projects: [
      {
        test: {
          name: 'core',
          sequence: { groupOrder: 0 },
          include: ['test/core/**/*.test.ts', 'test/scripts/**/*.test.ts', 'test/web/**/*.test.ts'],
          environment: 'node',
          testTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'api',
          sequence: { groupOrder: 1 },
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
          sequence: { groupOrder: 2 },
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
