import { eq } from 'drizzle-orm'
import { recordStepSchema } from '#shared/utils/readiness-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/** Records one attempt at the current step; saved at once so a reload resumes here. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, recordStepSchema)
  await useDb().transaction(async (tx) => {
    const check = await lockOpenCheck(tx, caller.organizationId, id)
    const { entry, changes } = applyStep(check, input, caller.id)
    await tx.update(schema.readinessChecks).set(changes).where(eq(schema.readinessChecks.id, id))
    await writeAudit(tx, caller, { entityType: 'readiness-check', entityId: id, action: changes.status === 'passed' ? 'step-recorded-and-passed' : 'step-recorded', after: entry })
  })
  return findCheck(caller.organizationId, id)
})
