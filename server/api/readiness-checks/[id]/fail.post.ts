import { eq } from 'drizzle-orm'
import { idParamSchema } from '#shared/utils/user-schemas'

/** Ends the check as failed after a step did not meet its rule (instead of retrying it). */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  await useDb().transaction(async (tx) => {
    const check = await lockOpenCheck(tx, caller.organizationId, id)
    const last = check.entries.findLast(e => e.stepIndex === check.currentStep)
    if (!last || last.passed) {
      throw httpError(409, 'A check ends as failed only after a step has failed. Record the current step, or abandon the check with a reason.')
    }
    await tx.update(schema.readinessChecks).set({ status: 'failed', completedAt: new Date() }).where(eq(schema.readinessChecks.id, id))
    await writeAudit(tx, caller, { entityType: 'readiness-check', entityId: id, action: 'failed', after: { failedStep: check.currentStep } })
  })
  return findCheck(caller.organizationId, id)
})
