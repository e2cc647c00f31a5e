import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

const root = fileURLToPath(new URL('.', import.meta.url))

export default defineConfig({
  resolve: {
    alias: { '#shared': `${root}shared`, '~~': root.replace(/\/$/, '') },
  },
  test: {
    projects: [
      {
        extends: true,
        test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node', testTimeout: 30_000 }, // property tests run thousands of cases; a busy 2-core machine needs more than 5 s
      },
      {
        extends: true,
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          globalSetup: ['tests/support/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/support/global-setup.ts'],
          testTimeout: 120_000,
          hookTimeout: 180_000,
          fileParallelism: false,
        },
      },
      // Benchmarks print figures and assert no timings; only `npm run bench` runs them.
      ...(process.env.TIDEWELL_BENCH === '1'
        ? [{
            extends: true as const,
            test: {
              name: 'bench',
              include: ['tests/bench/**/*.bench.ts'],
              globalSetup: ['tests/support/global-setup.ts'],
              testTimeout: 900_000,
              hookTimeout: 900_000,
              fileParallelism: false,
            },
          }]
        : []),
    ],
  },
})
