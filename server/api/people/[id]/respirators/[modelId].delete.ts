import { and, eq } from 'drizzle-orm'
import { respiratorParamSchema } from '#shared/utils/oversight-schemas'

/** Removes an assignment; the person's fit-test history for that respirator stays. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id, modelId } = parseParams(event, respiratorParamSchema)
  const a = schema.respiratorAssignments
  const removed = await useDb().transaction(async (tx) => {
    const [row] = await tx.delete(a).where(and(eq(a.organizationId, caller.organizationId), eq(a.personId, id), eq(a.respiratorModelId, modelId))).returning()
    if (row) await writeAudit(tx, caller, { entityType: 'person', entityId: id, action: 'respirator-unassigned', before: { respiratorModelId: modelId } })
    return row
  })
  if (!removed) throw httpError(404, 'This respirator is not assigned to this person.')
  return { ok: true }
})
