import { defineConfig } from 'vitest/config';
import path from 'node:path';

// Three projects: unit (pure lib code), integration (real PostgreSQL, real HTTP to a running app),
// e2e (Debian Chromium through playwright-core). scripts/test.sh starts the services they need.
export default defineConfig({
  // server-only guards the app's bundles; tests call server modules directly (tests/helpers/server-only.ts).
  resolve: { alias: { '@': path.resolve(__dirname), 'server-only': path.resolve(__dirname, 'tests/helpers/server-only.ts') } },
  test: {
    projects: [
      {
        extends: true,
        test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node', sequence: { groupOrder: 0 } },
      },
      {
        extends: true,
        test: {
          name: 'integration',
          // Fault tests restart PostgreSQL and kill the fakes: never alongside the browser tests.
          sequence: { groupOrder: 1 },
          include: ['tests/integration/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60_000,
          hookTimeout: 60_000,
          fileParallelism: false,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          sequence: { groupOrder: 2 },
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          testTimeout: 120_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
