import { eq } from 'drizzle-orm'
import { settingsSchema } from '#shared/utils/settings-schemas'

/** Changes only the settings sent; every other setting keeps its value. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const body = await parseBody(event, settingsSchema)
  const changes = Object.fromEntries(Object.entries(body).filter(([, value]) => value !== undefined))
  const organization = await findOrganization(caller.organizationId)
  const settings = { ...organization.settings, ...changes }
  if (Object.keys(changes).length) {
    await useDb().transaction(async (tx) => {
      await tx.update(schema.organizations).set({ settings }).where(eq(schema.organizations.id, caller.organizationId))
      await writeAudit(tx, caller, { entityType: 'organization', entityId: caller.organizationId, action: 'settings-updated', before: organization.settings, after: changes })
    })
  }
  return settingsView({ ...organization, settings })
})
