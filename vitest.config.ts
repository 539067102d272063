import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const alias = { '~': fileURLToPath(new URL('./src', import.meta.url)) };

// Two tiers: `unit` is pure (no database, no server); `integration` talks to the real
// PostgreSQL and the real built server that tests/global-setup.ts starts on loopback.
export default defineConfig({
  resolve: { alias },
  test: {
    // Integration files share one server and database; run files one after another.
    fileParallelism: false,
    reporters: ['default', './tests/support/summary-reporter.ts'],
    projects: [
      { resolve: { alias }, test: { name: 'unit', environment: 'node', include: ['tests/unit/**/*.test.ts'] } },
      {
        resolve: { alias },
        test: {
          name: 'integration',
          environment: 'node',
          include: ['tests/api/**/*.test.ts', 'tests/db/**/*.test.ts', 'tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
