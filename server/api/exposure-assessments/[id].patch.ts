import { eq } from 'drizzle-orm'
import { assessmentIdSchema, updateAssessmentSchema } from '#shared/utils/exposure-schemas'

/** Edits a draft. A signed-off revision is never edited: revise it instead. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'review')
  const { id } = parseParams(event, assessmentIdSchema)
  const body = await parseBody(event, updateAssessmentSchema)
  const row = await findAssessment(caller.organizationId, id)
  if (row.status !== 'draft') throw assessmentError(409, 'This assessment is signed off and cannot be changed. Start a revision with a reason instead.')
  if (row.version !== body.version) throw assessmentError(409, 'Someone else saved this draft since you opened it. Reload to see their changes.')
  const result = evaluateForSave(body, row.ruleSet === 'uk-hse' ? 'uk-hse' : 'us-osha')
  await assertAssessmentSite(caller.organizationId, body.siteId)
  const a = schema.exposureAssessments
  const updated = await useDb().transaction(async (tx) => {
    const [next] = await tx.update(a).set({
      title: body.title, siteId: body.siteId ?? null, input: body.input, chosenClassKeys: body.chosenClassKeys, rationale: body.rationale,
      requiredProtectionFactor: result.requiredProtectionFactor, idlhAtmosphere: result.idlhAtmosphere, version: row.version + 1
    }).where(eq(a.id, row.id)).returning()
    await writeAudit(tx, caller, { entityType: 'exposure-assessment', entityId: row.id, action: 'update', before: row, after: next })
    return next!
  })
  return { id: updated.id, version: updated.version }
})
