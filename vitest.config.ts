import { defineConfig } from 'vitest/config'

// Three projects, run in this order by scripts/test.mjs: pure unit tests next to the code,
// API tests over a real PostgreSQL, and browser end-to-end tests in Debian's Chromium.
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          include: ['shared/src/**/*.test.ts', 'server/src/**/*.test.ts', 'client/src/**/*.test.{ts,tsx}'],
          environment: 'node',
          setupFiles: ['tests/setup/per-file.ts'],
        },
      },
      {
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          globalSetup: ['tests/setup/global-setup.ts'],
          setupFiles: ['tests/setup/per-file.ts'],
          testTimeout: 20_000,
          hookTimeout: 60_000,
        },
      },
      {
        // Fault and two-process proofs: each file starts and stops its own PostgreSQL, S3 and SMTP.
        test: {
          name: 'faults',
          include: ['tests/faults/**/*.test.ts'],
          setupFiles: ['tests/setup/per-file.ts'],
          testTimeout: 120_000,
          hookTimeout: 180_000,
          fileParallelism: false,
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/setup/e2e-global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
          setupFiles: ['tests/setup/per-file.ts'],
        },
      },
    ],
  },
})
