import { eq } from 'drizzle-orm'
import { abandonCheckSchema } from '#shared/utils/readiness-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/** Stops a check without a verdict; it covers nothing and keeps its reason. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const { reason } = await parseBody(event, abandonCheckSchema)
  await useDb().transaction(async (tx) => {
    await lockOpenCheck(tx, caller.organizationId, id)
    await tx.update(schema.readinessChecks).set({ status: 'abandoned', abandonReason: reason, completedAt: new Date() }).where(eq(schema.readinessChecks.id, id))
    await writeAudit(tx, caller, { entityType: 'readiness-check', entityId: id, action: 'abandoned', after: { reason } })
  })
  return findCheck(caller.organizationId, id)
})
