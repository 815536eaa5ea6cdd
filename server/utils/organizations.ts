import { asc, eq } from 'drizzle-orm'
import type { H3Event } from 'h3'

type Organization = typeof schema.organizations.$inferSelect
type Site = typeof schema.sites.$inferSelect
interface Remembered { organization: Organization, sites: Site[] }

/** Kept by requireRole, which reads the caller's organization and sites in its own query. */
export function rememberOrganization(event: H3Event, organization: Organization, sites: Site[]) {
  event.context.callerOrganization = { organization, sites } satisfies Remembered
}

/**
 * The organization read at the start of this request, when the request only reads (GET/HEAD):
 * a request that changes things reads afresh, so it never acts on what it has just changed.
 */
function remembered(organizationId: string): Remembered | undefined {
  try {
    const event = useEvent()
    if (event.method !== 'GET' && event.method !== 'HEAD') return undefined
    const kept = event.context.callerOrganization as Remembered | undefined
    return kept?.organization.id === organizationId ? kept : undefined
  } catch {
    return undefined
  }
}

export async function findOrganization(id: string) {
  const kept = remembered(id)
  if (kept) return kept.organization
  const [org] = await useDb().select().from(schema.organizations).where(eq(schema.organizations.id, id))
  if (!org) throw httpError(404, 'Organization not found.')
  return org
}

export async function listSites(organizationId: string) {
  const kept = remembered(organizationId)
  if (kept) return kept.sites
  return useDb().select().from(schema.sites)
    .where(eq(schema.sites.organizationId, organizationId))
    .orderBy(asc(schema.sites.name))
}
