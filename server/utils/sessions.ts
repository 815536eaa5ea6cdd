import { eq, sql } from 'drizzle-orm'
import type { H3Event } from 'h3'
import type { Role } from '#shared/utils/roles'

interface SessionUser {
  id: string
  organizationId: string
  role: Role
  email: string
  displayName: string
  sessionVersion: number
}

/** Seals a fresh session cookie that carries the user's current session version. */
export async function startSession(event: H3Event, user: SessionUser) {
  await setUserSession(event, {
    user: { id: user.id, organizationId: user.organizationId, role: user.role, email: user.email, displayName: user.displayName },
    sessionVersion: user.sessionVersion,
    signedInAt: new Date().toISOString()
  })
}

type Executor = Pick<ReturnType<typeof useDb>, 'update'>

/**
 * Ends every session of the user, on every device: cookies carry the version they were issued
 * under and `requireRole` refuses an older one. Reactivating an account later does not lower the
 * version, so old cookies stay dead.
 */
export async function endAllSessions(db: Executor, userId: string) {
  const [row] = await db.update(schema.users)
    .set({ sessionVersion: sql`${schema.users.sessionVersion} + 1` })
    .where(eq(schema.users.id, userId))
    .returning({ sessionVersion: schema.users.sessionVersion })
  return row?.sessionVersion
}
