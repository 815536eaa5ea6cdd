// Database-level steps that need the `pg` package (so: after dependencies are installed).
import { fileURLToPath } from 'node:url'
import pg from 'pg'
import { drizzle } from 'drizzle-orm/node-postgres'
import { migrate } from 'drizzle-orm/node-postgres/migrator'

const migrationsFolder = fileURLToPath(new URL('../../drizzle', import.meta.url))

function withDatabase(url, database) {
  const u = new URL(url)
  u.pathname = `/${database}`
  return u.toString()
}

/** Creates `name` on the server of `serverUrl` when missing; with `recreate`, drops it first. */
export async function ensureDatabase(serverUrl, name, { recreate = false } = {}) {
  const client = new pg.Client({ connectionString: withDatabase(serverUrl, 'postgres') })
  await client.connect()
  try {
    if (recreate) {
      await client.query(`drop database if exists "${name}" with (force)`)
    }
    const { rowCount } = await client.query('select 1 from pg_database where datname = $1', [name])
    if (!rowCount) await client.query(`create database "${name}"`)
  } finally {
    await client.end()
  }
  return withDatabase(serverUrl, name)
}

/** Applies the committed SQL migrations in drizzle/; already-applied ones are skipped. */
export async function applyMigrations(url) {
  const pool = new pg.Pool({ connectionString: url, max: 1 })
  try {
    await migrate(drizzle(pool), { migrationsFolder })
  } finally {
    await pool.end()
  }
}

/** True when the database holds no organization yet: the demo scenario has not been loaded. */
export async function isEmpty(url) {
  const client = new pg.Client({ connectionString: url })
  await client.connect()
  try {
    const { rows } = await client.query('select count(*)::int as n from organizations')
    return rows[0].n === 0
  } finally {
    await client.end()
  }
}

async function queryOne(url, sql, params = []) {
  const client = new pg.Client({ connectionString: url })
  await client.connect()
  try {
    return (await client.query(sql, params)).rows[0]
  } finally {
    await client.end()
  }
}

/** True when the demo scenario's organizations are in the database (so its sign-ins are worth printing). */
export async function hasDemoAccounts(url) {
  const { DEMO_ORGANIZATIONS } = await import('../seed/demo-accounts.mjs')
  const row = await queryOne(url, 'select count(*)::int as n from organizations where slug = any($1)', [DEMO_ORGANIZATIONS.map(o => o.slug)])
  return row.n > 0
}

/** True when no user account exists at all: someone must create the first admin. */
export async function hasNoAccount(url) {
  const row = await queryOne(url, 'select count(*)::int as n from users')
  return row.n === 0
}
