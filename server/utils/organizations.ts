import { asc, eq } from 'drizzle-orm'

export async function findOrganization(id: string) {
  const [org] = await useDb().select().from(schema.organizations).where(eq(schema.organizations.id, id))
  if (!org) throw httpError(404, 'Organization not found.')
  return org
}

export async function listSites(organizationId: string) {
  return useDb().select().from(schema.sites)
    .where(eq(schema.sites.organizationId, organizationId))
    .orderBy(asc(schema.sites.name))
}
