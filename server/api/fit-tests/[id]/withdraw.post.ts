import { and, eq } from 'drizzle-orm'
import { reasonSchema } from '#shared/utils/fit-test-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/**
 * Withdraws a finished record: its fit card then verifies as withdrawn. Withdrawal is a program
 * decision, so an admin or a tester makes it; a reviewer recommends it through countersign comments.
 * The record lock makes a second withdrawal, or one racing a correction, see the state it left.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const { reason } = await parseBody(event, reasonSchema)
  const { recordId } = await findFitTest(caller.organizationId, id)
  const t = schema.fitTests
  await useDb().transaction(async (tx) => {
    const revisions = await lockRecord(tx, caller.organizationId, recordId)
    const row = revisions.find(r => r.id === id)!
    if (row.status === 'withdrawn') {
      throw httpError(409, 'This record has already been withdrawn; nothing was changed.')
    }
    if (row.status !== 'finished') {
      throw httpError(409, 'Only a finished, current record can be withdrawn.')
    }
    await tx.update(t).set({ status: 'withdrawn', withdrawnReason: reason }).where(and(eq(t.id, id), eq(t.status, 'finished')))
    await refreshInsights(tx, caller.organizationId, recordId)
    await writeAudit(tx, caller, { entityType: 'fit-test', entityId: id, action: 'withdrawn', after: { reason } })
  })
  return fitTestView(caller, await findFitTest(caller.organizationId, id))
})
