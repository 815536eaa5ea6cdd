import { randomUUID } from 'node:crypto'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { drizzle } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import * as schema from '../../server/database/schema'
import { ROLES } from '../../shared/utils/roles'
import type { Role } from '../../shared/utils/roles'
import { databaseUrl } from './env'

const hash = new Hash(new Scrypt({}))
export const FIXTURE_PASSWORD = 'fixture-password-1'

let pool: pg.Pool | undefined
export function testDb() {
  pool ??= new pg.Pool({ connectionString: databaseUrl, max: 3 })
  return drizzle(pool, { schema, casing: 'snake_case' })
}

export async function closeTestDb() {
  await pool?.end()
  pool = undefined
}

export interface FixtureUser {
  id: string
  email: string
  password: string
  role: Role
}

export interface FixtureOrganization {
  id: string
  name: string
  users: Record<Role, FixtureUser>
}

/** A fresh organization of invented test data with one active user per role. */
export async function createOrganization(label = 'Fixture'): Promise<FixtureOrganization> {
  const db = testDb()
  const tag = randomUUID().slice(0, 8)
  const name = `${label} Works ${tag}`
  const [org] = await db.insert(schema.organizations).values({ name, slug: `fixture-${tag}` }).returning()
  await db.insert(schema.sites).values({ organizationId: org!.id, name: 'Fixture Site', timeZone: 'America/New_York' })
  const passwordHash = await hash.make(FIXTURE_PASSWORD)
  const rows = await db.insert(schema.users).values(ROLES.map(role => ({
    organizationId: org!.id,
    email: `${role}.${tag}@fixture.example`,
    displayName: `${role[0]!.toUpperCase()}${role.slice(1)} ${tag}`,
    role,
    passwordHash
  }))).returning()
  const users = Object.fromEntries(rows.map(u => [u.role, { id: u.id, email: u.email, password: FIXTURE_PASSWORD, role: u.role }])) as Record<Role, FixtureUser>
  return { id: org!.id, name, users }
}
