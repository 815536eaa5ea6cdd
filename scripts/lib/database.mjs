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
export async function ensureDatabase(serverUrl, name, { recreate = false, owner } = {}) {
  const client = new pg.Client({ connectionString: withDatabase(serverUrl, 'postgres') })
  await client.connect()
  try {
    if (recreate) {
      await client.query(`drop database if exists "${name}" with (force)`)
    }
    const { rowCount } = await client.query('select 1 from pg_database where datname = $1', [name])
    if (!rowCount) await client.query(`create database "${name}"${owner ? ` owner "${owner}"` : ''}`)
  } finally {
    await client.end()
  }
  return withDatabase(serverUrl, name)
}

/** The two roles of the private cluster: the owner runs migrations, the app only reads and writes. */
export const ROLES = { owner: 'sealwright_owner', app: 'sealwright_app' }

function withCredentials(url, user, password) {
  const u = new URL(url)
  u.username = encodeURIComponent(user)
  u.password = encodeURIComponent(password)
  return u.toString()
}

function literal(text) {
  return `'${String(text).replace(/'/g, '\'\'')}'`
}

/**
 * Creates (or re-passwords) the owner and app roles, hands database `name` and everything in it
 * to the owner (a database made before the roles existed belongs to the superuser), and returns
 * the owner's and the app's URLs. Needs the superuser's URL; idempotent.
 */
async function ensureRoles(serverUrl, passwords) {
  const admin = new pg.Client({ connectionString: withDatabase(serverUrl, 'postgres') })
  await admin.connect()
  try {
    await admin.query(`set password_encryption = 'scram-sha-256'`)
    for (const [role, password, extra] of [[ROLES.owner, passwords.owner, ''], [ROLES.app, passwords.app, ' noinherit']]) {
      const { rowCount } = await admin.query('select 1 from pg_roles where rolname = $1', [role])
      const verb = rowCount ? 'alter' : 'create'
      await admin.query(`${verb} role "${role}" with login nosuperuser nocreatedb nocreaterole nobypassrls${extra} password ${literal(password)}`)
    }
  } finally {
    await admin.end()
  }
}

async function adoptDatabase(serverUrl, name, passwords) {
  const admin = new pg.Client({ connectionString: withDatabase(serverUrl, 'postgres') })
  await admin.connect()
  try {
    await admin.query(`alter database "${name}" owner to "${ROLES.owner}"`)
  } finally {
    await admin.end()
  }

  const db = new pg.Client({ connectionString: withDatabase(serverUrl, name) })
  await db.connect()
  try {
    // Objects left by migrations run as the superuser (clusters made before the roles existed).
    await db.query(`
      do $$
      declare item record;
      begin
        for item in
          select format('alter %s %I.%I owner to ${ROLES.owner}', case c.relkind when 'S' then 'sequence' when 'v' then 'view' when 'm' then 'materialized view' else 'table' end, n.nspname, c.relname) as stmt
          from pg_class c join pg_namespace n on n.oid = c.relnamespace
          where n.nspname in ('public', 'drizzle') and c.relkind in ('r', 'p', 'v', 'm')
            and pg_get_userbyid(c.relowner) <> '${ROLES.owner}'
        union all
          select format('alter function %s owner to ${ROLES.owner}', p.oid::regprocedure)
          from pg_proc p join pg_namespace n on n.oid = p.pronamespace
          where n.nspname = 'public' and pg_get_userbyid(p.proowner) <> '${ROLES.owner}'
        union all
          select format('alter type %I.%I owner to ${ROLES.owner}', n.nspname, t.typname)
          from pg_type t join pg_namespace n on n.oid = t.typnamespace
          where n.nspname = 'public' and t.typtype = 'e' and pg_get_userbyid(t.typowner) <> '${ROLES.owner}'
        union all
          select format('alter schema %I owner to ${ROLES.owner}', nspname)
          from pg_namespace where nspname = 'drizzle' and pg_get_userbyid(nspowner) <> '${ROLES.owner}'
        loop
          execute item.stmt;
        end loop;
      end $$;
    `)
    await db.query(`revoke all on schema public from public`)
    await db.query(`grant usage on schema public to "${ROLES.app}"`)
  } finally {
    await db.end()
  }
  return {
    ownerUrl: withCredentials(withDatabase(serverUrl, name), ROLES.owner, passwords.owner),
    appUrl: withCredentials(withDatabase(serverUrl, name), ROLES.app, passwords.app)
  }
}

/**
 * What the app's role may do, granted by the owner after every migration run: read and write the
 * tables, but only insert into and read the audit trail; never TRUNCATE, never ALTER (so no
 * disabling a trigger), and as a non-superuser it cannot set session_replication_role.
 */
export async function grantAppPrivileges(ownerUrl, appRole) {
  const client = new pg.Client({ connectionString: ownerUrl })
  await client.connect()
  try {
    const database = new URL(ownerUrl).pathname.slice(1)
    await client.query(`grant connect on database "${database}" to "${appRole}"`)
    // Lets a job queue create a schema of its own; it gives no power over the tables in public.
    await client.query(`grant create on database "${database}" to "${appRole}"`)
    await client.query(`grant usage on schema public to "${appRole}"`)
    await client.query(`revoke all on all tables in schema public from "${appRole}"`)
    await client.query(`grant select, insert, update, delete on all tables in schema public to "${appRole}"`)
    await client.query(`revoke update, delete on audit_events from "${appRole}"`)
    await client.query(`grant usage, select on all sequences in schema public to "${appRole}"`)
  } finally {
    await client.end()
  }
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

/**
 * Everything between a running server and a database the app may use.
 * Private cluster (superuser URL): roles, database owned by the owner role, migrations as the
 * owner, then the app role's grants; returns the owner's URL (migrations, seeding, test fixtures)
 * and the app's URL. External database: NUXT_DATABASE_URL is the app's connection; when
 * SEALWRIGHT_DATABASE_OWNER_URL names a second role, migrations run as that one and the app's role
 * gets the same grants, else the one URL does both (no separation; we say so).
 */
export async function prepareDatabase(server, name, { recreate = false, passwords, ownerUrl: externalOwnerUrl } = {}) {
  if (server.external) {
    const ownerUrl = externalOwnerUrl || server.serverUrl
    await applyMigrations(ownerUrl)
    const separated = ownerUrl !== server.serverUrl
    if (separated) await grantAppPrivileges(ownerUrl, decodeURIComponent(new URL(server.serverUrl).username))
    return { ownerUrl, appUrl: server.serverUrl, separated }
  }
  await ensureRoles(server.serverUrl, passwords)
  await ensureDatabase(server.serverUrl, name, { recreate, owner: ROLES.owner })
  const { ownerUrl, appUrl } = await adoptDatabase(server.serverUrl, name, passwords)
  await applyMigrations(ownerUrl)
  await grantAppPrivileges(ownerUrl, ROLES.app)
  return { ownerUrl, appUrl, separated: true }
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
