import { and, eq } from 'drizzle-orm'
import { discardSchema } from '#shared/utils/oversight-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/** Discards a draft started by mistake. The row and the audit entry stay; it leaves every list and count. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const { reason } = await parseBody(event, discardSchema)
  const row = await findFitTest(caller.organizationId, id)
  if (row.status !== 'draft') throw httpError(409, 'Only a draft can be discarded. A finished record can be withdrawn with a reason instead.')
  const t = schema.fitTests
  const done = await useDb().transaction(async (tx) => {
    const [updated] = await tx.update(t).set({ status: 'discarded', discardedReason: reason }).where(and(eq(t.organizationId, caller.organizationId), eq(t.id, id), eq(t.status, 'draft'))).returning({ id: t.id })
    if (updated) await writeAudit(tx, caller, { entityType: 'fit-test', entityId: id, action: 'discarded', before: { status: 'draft' }, after: { reason } })
    return updated
  })
  if (!done) throw httpError(409, 'This draft was finished or discarded meanwhile. Reload to see it.')
  return fitTestView(caller, await findFitTest(caller.organizationId, id))
})
