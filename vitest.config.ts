import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

const sharedDir = fileURLToPath(new URL('./shared', import.meta.url))

// Three projects: `unit` (the shared computation module, no Nuxt), `api` (routes over HTTP on
// real PostgreSQL) and `e2e` (Chromium). `npm test` starts the database, mail catcher and app
// that api and e2e need, and passes their addresses in SEALWRIGHT_TEST_* variables.
export default defineConfig({
  resolve: {
    alias: { '#shared': sharedDir }
  },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node'
        }
      },
      {
        extends: true,
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/require-services.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000
        }
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/require-services.ts'],
          testTimeout: 90_000,
          hookTimeout: 120_000,
          fileParallelism: false
        }
      }
    ]
  }
})
