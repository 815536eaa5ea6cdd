import { randomUUID } from 'node:crypto'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { eq } from 'drizzle-orm'
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

export interface FixtureProgram {
  siteId: string
  personId: string
  halfMaskId: string
  fullFacepieceId: string
  counterId: string
}

/** Roster, catalogue and counter rows for one organization: invented test data. */
export async function createProgram(org: FixtureOrganization, options: { wearerUserId?: string } = {}): Promise<FixtureProgram> {
  const db = testDb()
  const [site] = await db.select().from(schema.sites).where(eq(schema.sites.organizationId, org.id))
  const [person] = await db.insert(schema.people).values({ organizationId: org.id, siteId: site!.id, fullName: 'Rowan Testwell', employeeNumber: `E-${randomUUID().slice(0, 6)}`, medicalClearanceStatus: 'cleared', medicalClearanceOn: '2026-01-15', userId: options.wearerUserId ?? null }).returning()
  const [half, full] = await db.insert(schema.respiratorModels).values([
    { organizationId: org.id, make: 'Fixture Safety', model: 'FX-2 half mask', respiratorClass: 'elastomeric-half-mask', sizes: ['S', 'M', 'L'] },
    { organizationId: org.id, make: 'Fixture Safety', model: 'FX-9 full facepiece', respiratorClass: 'elastomeric-full-facepiece', sizes: ['M', 'L'] }
  ]).returning()
  const [counter] = await db.insert(schema.counters).values({ organizationId: org.id, siteId: site!.id, serialNumber: `FXC-${randomUUID().slice(0, 6)}`, description: 'Fixture counter', sampleFlowCm3PerMin: 100, calibrationDueOn: '2027-06-30' }).returning()
  return { siteId: site!.id, personId: person!.id, halfMaskId: half!.id, fullFacepieceId: full!.id, counterId: counter!.id }
}
