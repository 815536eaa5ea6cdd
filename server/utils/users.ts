import { and, asc, count, desc, eq, ilike, ne, or, sql } from 'drizzle-orm'
import type { z } from 'zod'
import type { listUsersQuerySchema } from '#shared/utils/user-schemas'

/** Columns safe to send to a browser: never the password hash. */
export const publicUserColumns = {
  id: schema.users.id,
  email: schema.users.email,
  displayName: schema.users.displayName,
  role: schema.users.role,
  active: schema.users.active,
  lastSignInAt: schema.users.lastSignInAt,
  createdAt: schema.users.createdAt,
  hasPassword: schema.users.passwordHash
}

export type PublicUser = Awaited<ReturnType<typeof findUser>>

function toPublic<T extends { hasPassword: string | null }>(row: T): Omit<T, 'hasPassword'> & { hasPassword: boolean } {
  const { hasPassword, ...rest } = row
  return { ...rest, hasPassword: hasPassword !== null }
}

export async function listUsers(organizationId: string, query: z.output<typeof listUsersQuerySchema>) {
  const u = schema.users
  const search = query.q ? `%${query.q.replace(/[%_\\]/g, m => `\\${m}`)}%` : undefined
  const order = query.dir === 'desc' ? desc : asc
  const rows = await useDb().select(publicUserColumns).from(u)
    .where(and(
      eq(u.organizationId, organizationId),
      search ? or(ilike(u.displayName, search), ilike(u.email, search)) : undefined
    ))
    .orderBy(order(u[query.sort]), asc(u.email))
  return rows.map(toPublic)
}

/** One user of the organization, or a 404 that reads the same for "missing" and "not yours". */
export async function findUser(organizationId: string, id: string) {
  const [row] = await useDb().select(publicUserColumns).from(schema.users)
    .where(and(eq(schema.users.organizationId, organizationId), eq(schema.users.id, id)))
  if (!row) {
    throw httpError(404, 'No such user in your organization.')
  }
  return toPublic(row)
}

export async function countOtherActiveAdmins(organizationId: string, exceptUserId: string) {
  const u = schema.users
  const [row] = await useDb().select({ n: count() }).from(u)
    .where(and(eq(u.organizationId, organizationId), eq(u.role, 'admin'), eq(u.active, true), ne(u.id, exceptUserId)))
  return row?.n ?? 0
}

/** Every account under this address (one per organization at most), most recently used first. */
export async function findUsersByEmail(email: string) {
  return useDb().select().from(schema.users).where(eq(schema.users.email, email))
    .orderBy(sql`${schema.users.lastSignInAt} desc nulls last`, asc(schema.users.createdAt))
}

/** The organization's account under this address, or null. */
export async function findOrganizationUserByEmail(organizationId: string, email: string) {
  const [row] = await useDb().select({ id: schema.users.id }).from(schema.users)
    .where(and(eq(schema.users.organizationId, organizationId), eq(schema.users.email, email)))
  return row ?? null
}
