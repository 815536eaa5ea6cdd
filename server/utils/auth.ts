import { and, eq } from 'drizzle-orm'
import type { H3Event } from 'h3'
import type { Role } from '#shared/utils/roles'
import type { Permission } from '#shared/utils/permissions'
import { roleMay } from '#shared/utils/permissions'

export interface Caller {
  id: string
  organizationId: string
  role: Role
  email: string
  displayName: string
}

/**
 * The one gate every API route passes through. It re-reads the user from the database on each
 * request, so a deactivated user or a changed role takes effect at once, whatever the cookie says.
 * A cookie older than the user's session version is refused too (see `endAllSessions`).
 * Anonymous → 401; signed in with a role the permission table (shared/utils/permissions.ts) does
 * not give `permission` → 403. Admins pass every check. With no permission, any active signed-in
 * user passes.
 */
export async function requireRole(event: H3Event, permission?: Permission): Promise<Caller> {
  const session = await getUserSession(event)
  const sessionUser = session.user
  if (!sessionUser?.id) {
    throw httpError(401, 'Sign in to continue.')
  }
  const [user] = await useDb()
    .select({
      id: schema.users.id,
      organizationId: schema.users.organizationId,
      role: schema.users.role,
      email: schema.users.email,
      displayName: schema.users.displayName,
      active: schema.users.active,
      sessionVersion: schema.users.sessionVersion
    })
    .from(schema.users)
    .where(and(eq(schema.users.id, sessionUser.id), eq(schema.users.organizationId, sessionUser.organizationId)))
  if (!user || !user.active) {
    await clearUserSession(event)
    throw httpError(401, 'Your account is no longer active. Ask your program administrator.')
  }
  // A cookie issued before the last sign-out everywhere, password change or deactivation is dead.
  if (session.sessionVersion !== user.sessionVersion) {
    await clearUserSession(event)
    throw httpError(401, 'Your session has ended. Sign in again.')
  }
  if (permission && !roleMay(user.role, permission)) {
    throw httpError(403, 'Your role does not allow this.')
  }
  const caller: Caller = { id: user.id, organizationId: user.organizationId, role: user.role, email: user.email, displayName: user.displayName }
  event.context.caller = caller
  return caller
}
