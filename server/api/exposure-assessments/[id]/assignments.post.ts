import { and, eq } from 'drizzle-orm'
import { assessmentIdSchema, assignmentSchema } from '#shared/utils/exposure-schemas'

/** Puts one person, or everyone with a job title, under this assessment. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'review')
  const { id } = parseParams(event, assessmentIdSchema)
  const body = await parseBody(event, assignmentSchema)
  const row = await findAssessment(caller.organizationId, id)
  if (body.personId) {
    const p = schema.people
    const [person] = await useDb().select({ id: p.id }).from(p).where(and(eq(p.organizationId, caller.organizationId), eq(p.id, body.personId)))
    if (!person) throw assessmentError(400, 'Choose a person from your roster.', { personId: 'Choose a person from your roster.' })
  }
  const assigned = await useDb().transaction(async (tx) => {
    const [created] = await tx.insert(schema.exposureAssignments).values({
      organizationId: caller.organizationId, recordId: row.recordId, personId: body.personId ?? null, jobTitle: body.jobTitle ?? null, createdByUserId: caller.id
    }).onConflictDoNothing().returning()
    if (created) await writeAudit(tx, caller, { entityType: 'exposure-assignment', entityId: created.id, action: 'create', after: created })
    return created
  })
  if (!assigned) throw assessmentError(409, 'Already assigned to this assessment.', body.personId ? { personId: 'Already assigned.' } : { jobTitle: 'Already assigned.' })
  setResponseStatus(event, 201)
  return { id: assigned.id }
})
