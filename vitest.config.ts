import { defineConfig } from 'vitest/config';

// Three projects so each kind of test can run alone (`npm run test:unit`, `test:api`, `test:browser`).
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.{ts,tsx}', 'tests/engine/**/*.test.ts'],
          environment: 'node',
          setupFiles: ['tests/setup/fast-check.ts'],
          server: { deps: { inline: ['quickhull3d'] } },
          testTimeout: 30_000,
        },
      },
      {
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          // Each file migrates its own SQLite file; forks keep native handles apart.
          pool: 'forks',
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        test: {
          name: 'browser',
          include: ['tests/browser/**/*.test.ts'],
          environment: 'node',
          pool: 'forks',
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
