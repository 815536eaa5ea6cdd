import { and, eq, sql } from 'drizzle-orm'
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
  const session = await readUserSession(event)
  const sessionUser = session.user
  if (!sessionUser?.id) {
    throw httpError(401, 'Sign in to continue.')
  }
  // One round trip: the user, their organization and its sites (kept for this request, see
  // requestOrganization in organizations.ts).
  const [user] = await callerStatement().execute({ userId: sessionUser.id, organizationId: sessionUser.organizationId })
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
  event.context.dataSnapshot = user.snapshot
  rememberOrganization(event, user.organization, user.sites)
  return caller
}

type Site = typeof schema.sites.$inferSelect

const callerStatement = preparedRead((db) => {
  const u = schema.users
  return db
    .select({
      id: u.id,
      organizationId: u.organizationId,
      role: u.role,
      email: u.email,
      displayName: u.displayName,
      active: u.active,
      sessionVersion: u.sessionVersion,
      // What the database holds, as of this statement: a page drawn now may be sent again while it
      // reads the same (server/utils/page-memo.ts).
      snapshot: sql<string>`pg_current_snapshot()::text`,
      organization: schema.organizations,
      sites: sitesOfOrganization()
    })
    .from(u)
    .innerJoin(schema.organizations, eq(schema.organizations.id, u.organizationId))
    .where(and(eq(u.id, sql.placeholder('userId')), eq(u.organizationId, sql.placeholder('organizationId'))))
    .prepare('caller')
})

/** The caller's sites, ordered by name, as rows shaped like a `select` of `sites` would give. */
function sitesOfOrganization() {
  return sql<Site[]>`(select coalesce(json_agg(json_build_object(
  'id', s.id, 'organizationId', s.organization_id, 'name', s.name, 'timeZone', s.time_zone, 'address', s.address,
  'createdAt', s.created_at, 'updatedAt', s.updated_at) order by s.name), '[]'::json)
  from sites s where s.organization_id = ${schema.users.organizationId})`.mapWith(rows => (rows as (Site & { createdAt: string, updatedAt: string })[])
    .map(s => ({ ...s, createdAt: new Date(s.createdAt), updatedAt: new Date(s.updatedAt) })))
}
