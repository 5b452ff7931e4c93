import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'
import { defineVitestProject } from '@nuxt/test-utils/config'

const r = (p: string) => fileURLToPath(new URL(p, import.meta.url))
const alias = { '#shared': r('./shared'), '~~': r('./'), '~': r('./app'), '@': r('./app') }

// Projects run in groups: unit + nuxt, then e2e, then browser (sequence.groupOrder).
// One server for e2e and browser: tests/support/global-setup.ts builds the app once (if stale),
// starts the fakes and `node .output/server/index.mjs` on a throw-away database, and shares the URL.
// On PostgreSQL (scripts/test.mjs sets BORELINE_E2E_DATABASE=postgres for its second run): the e2e project on a
// fresh PostgreSQL database, then the suite that starts two server processes on one database.
const onPostgres = process.env.BORELINE_E2E_DATABASE === 'postgres'
export default defineConfig({
  test: {
    // scripts/test.mjs names another report for its PostgreSQL run (a command-line outputFile does not override this one)
    reporters: ['default', ['json', { outputFile: process.env.BORELINE_VITEST_REPORT || 'test-results/vitest.json' }]],
    projects: [
      {
        resolve: { alias },
        test: { name: 'unit', include: ['tests/unit/**/*.test.ts', 'fakes/**/*.test.ts'], environment: 'node', testTimeout: 30_000, hookTimeout: 60_000, sequence: { groupOrder: 0 } },
      },
      await defineVitestProject({
        test: { name: 'nuxt', include: ['tests/nuxt/**/*.test.ts'], environment: 'nuxt', testTimeout: 30_000, hookTimeout: 120_000, sequence: { groupOrder: 0 } },
      }),
      {
        resolve: { alias },
        test: {
          name: 'e2e', include: ['tests/e2e/**/*.test.ts'], environment: 'node',
          globalSetup: ['tests/support/global-setup.ts'], fileParallelism: false, testTimeout: 60_000, hookTimeout: 600_000,
          sequence: { groupOrder: 1 },
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'browser', include: ['tests/browser/**/*.test.ts'], environment: 'node',
          globalSetup: ['tests/support/global-setup.ts'], fileParallelism: false, testTimeout: 120_000, hookTimeout: 600_000,
          // after e2e: browser journeys are timing-sensitive and 2 cores are shared
          sequence: { groupOrder: 2 },
        },
      },
      ...(onPostgres
        ? [{
            resolve: { alias },
            test: {
              // the e2e project's server is the first of the two processes (same setup, shared)
              name: 'processes', include: ['tests/processes/**/*.test.ts'], environment: 'node', globalSetup: ['tests/support/global-setup.ts'],
              fileParallelism: false, testTimeout: 120_000, hookTimeout: 600_000, sequence: { groupOrder: 3 },
            },
          }]
        : []),
    ],
  },
})
