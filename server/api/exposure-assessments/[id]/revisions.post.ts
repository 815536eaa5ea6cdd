import { and, eq, max } from 'drizzle-orm'
import { assessmentIdSchema, reviseAssessmentSchema } from '#shared/utils/exposure-schemas'

/** Starts a new draft revision of a signed-off assessment, with the reason; the signed-off one stays in force until the new one is signed off. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'review')
  const { id } = parseParams(event, assessmentIdSchema)
  const { reason } = await parseBody(event, reviseAssessmentSchema)
  const row = await findAssessment(caller.organizationId, id)
  if (row.status !== 'signed-off') throw assessmentError(409, 'Only the signed-off revision can be revised; edit the draft instead.')
  const a = schema.exposureAssessments
  const [open] = await useDb().select({ id: a.id }).from(a).where(and(eq(a.organizationId, caller.organizationId), eq(a.recordId, row.recordId), eq(a.status, 'draft')))
  if (open) throw assessmentError(409, 'A draft revision of this assessment is already open.', { reason: 'Finish or sign off the open draft first.' })
  const created = await useDb().transaction(async (tx) => {
    const [{ last } = { last: row.revision }] = await tx.select({ last: max(a.revision) }).from(a).where(eq(a.recordId, row.recordId))
    const [next] = await tx.insert(a).values({
      organizationId: row.organizationId, recordId: row.recordId, revision: (last ?? row.revision) + 1, revisionReason: reason,
      title: row.title, siteId: row.siteId, ruleSet: row.ruleSet, input: row.input, chosenClassKeys: row.chosenClassKeys, rationale: row.rationale,
      requiredProtectionFactor: row.requiredProtectionFactor, idlhAtmosphere: row.idlhAtmosphere, createdByUserId: caller.id
    }).returning()
    await writeAudit(tx, caller, { entityType: 'exposure-assessment', entityId: next!.id, action: 'revise', before: { id: row.id }, after: next })
    return next!
  })
  setResponseStatus(event, 201)
  return { id: created.id, revision: created.revision }
})
