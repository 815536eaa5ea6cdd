import { and, eq } from 'drizzle-orm'
import { reasonSchema } from '#shared/utils/fit-test-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/** Withdraws a finished record: its fit card then verifies as withdrawn. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'tester', 'reviewer')
  const { id } = parseParams(event, idParamSchema)
  const { reason } = await parseBody(event, reasonSchema)
  const row = await findFitTest(caller.organizationId, id)
  if (row.status !== 'finished') {
    throw httpError(409, 'Only a finished, current record can be withdrawn.')
  }
  const t = schema.fitTests
  await useDb().transaction(async (tx) => {
    await tx.update(t).set({ status: 'withdrawn', withdrawnReason: reason }).where(and(eq(t.id, id), eq(t.status, 'finished')))
    await writeAudit(tx, caller, { entityType: 'fit-test', entityId: id, action: 'withdrawn', after: { reason } })
  })
  return fitTestView(caller, await findFitTest(caller.organizationId, id))
})
