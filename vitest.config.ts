import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'
import { defineVitestProject } from '@nuxt/test-utils/config'

const sharedDir = fileURLToPath(new URL('./shared', import.meta.url))

// Four projects: `unit` (the shared computation module, no Nuxt), `nuxt` (components in the Nuxt
// environment on happy-dom, no services), `api` (routes over HTTP on real PostgreSQL) and `e2e` (Chromium). `npm test` starts the database, mail catcher and app
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
      defineVitestProject({
        test: {
          name: 'nuxt',
          include: ['tests/nuxt/**/*.test.ts'],
          environment: 'nuxt',
          environmentOptions: { nuxt: { domEnvironment: 'happy-dom' } },
          // Starting the Nuxt app in happy-dom takes seconds on a busy machine.
          hookTimeout: 120_000,
          testTimeout: 30_000
        }
      }),
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
