import { eq } from 'drizzle-orm'
import { settingsSchema } from '#shared/utils/equipment-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'admin')
  const changes = await parseBody(event, settingsSchema)
  const organization = await findOrganization(caller.organizationId)
  const settings = { ...organization.settings, ...changes }
  await useDb().transaction(async (tx) => {
    await tx.update(schema.organizations).set({ settings }).where(eq(schema.organizations.id, caller.organizationId))
    await writeAudit(tx, caller, { entityType: 'organization', entityId: caller.organizationId, action: 'settings-updated', before: organization.settings, after: changes })
  })
  return { uncoveredResults: settings.uncoveredResults ?? 'flag' }
})
