import { eq } from 'drizzle-orm'
import { protocolKeyParamSchema } from '#shared/utils/protocol-admin-schemas'

/** Stops offering a custom protocol for new tests; records keep their own copy of it. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const { key } = parseParams(event, protocolKeyParamSchema)
  const org = await findOrganization(caller.organizationId)
  const existing = customProtocolsOf(org)
  const removed = existing.find(p => p.key === key)
  if (!removed) throw httpError(404, 'No such custom protocol in your program.')
  const settings = { ...org.settings, customProtocols: existing.filter(p => p.key !== key) }
  await useDb().transaction(async (tx) => {
    await tx.update(schema.organizations).set({ settings }).where(eq(schema.organizations.id, caller.organizationId))
    await writeAudit(tx, caller, { entityType: 'organization', entityId: caller.organizationId, action: 'protocol-removed', before: removed })
  })
  return { removed: key }
})
