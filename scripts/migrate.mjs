// Applies drizzle/ migrations to DATABASE_URL (or NUXT_DATABASE_URL).
import { applyMigrations } from './lib/database.mjs'

const url = process.env.DATABASE_URL || process.env.NUXT_DATABASE_URL
if (!url) {
  console.error('Set DATABASE_URL (or NUXT_DATABASE_URL) to the database to migrate.')
  process.exit(1)
}
await applyMigrations(url)
console.log('Migrations applied.')
