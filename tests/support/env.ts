export const baseUrl = process.env.SEALWRIGHT_TEST_BASE_URL ?? 'http://127.0.0.1:3100'
export const databaseUrl = process.env.SEALWRIGHT_TEST_DATABASE_URL ?? ''
export const outboxUrl = process.env.SEALWRIGHT_TEST_OUTBOX_URL ?? ''
export const projectDir = new URL('../..', import.meta.url).pathname
/** The app's own (least-privilege) connection to the test database. */
export const appDatabaseUrl = process.env.SEALWRIGHT_TEST_APP_DATABASE_URL ?? ''
