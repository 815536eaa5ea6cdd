// api and e2e tests talk to a running app; `npm test` starts it and sets these variables.
export default function requireServices() {
  const missing = ['SEALWRIGHT_TEST_BASE_URL', 'SEALWRIGHT_TEST_DATABASE_URL', 'SEALWRIGHT_TEST_OUTBOX_URL'].filter(name => !process.env[name])
  if (missing.length) {
    throw new Error(`Missing ${missing.join(', ')}. Run the api and e2e tests through \`npm test\`, which starts PostgreSQL, the mail catcher and the app.`)
  }
}
