import { and, eq } from 'drizzle-orm'
import { assignmentIdSchema } from '#shared/utils/exposure-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'review')
  const { id, assignmentId } = parseParams(event, assignmentIdSchema)
  const row = await findAssessment(caller.organizationId, id)
  const x = schema.exposureAssignments
  await useDb().transaction(async (tx) => {
    const [gone] = await tx.delete(x).where(and(eq(x.organizationId, caller.organizationId), eq(x.recordId, row.recordId), eq(x.id, assignmentId))).returning()
    if (!gone) throw assessmentError(404, 'No such assignment on this assessment.')
    await writeAudit(tx, caller, { entityType: 'exposure-assignment', entityId: gone.id, action: 'delete', before: gone })
  })
  return { ok: true }
})
