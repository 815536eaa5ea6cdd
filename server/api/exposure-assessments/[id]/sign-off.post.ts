import { and, eq } from 'drizzle-orm'
import { assessmentIdSchema } from '#shared/utils/exposure-schemas'

/** Signs off a draft: it is locked from now on, and the record's earlier signed-off revision is superseded. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'review')
  const { id } = parseParams(event, assessmentIdSchema)
  const row = await findAssessment(caller.organizationId, id)
  if (row.status !== 'draft') throw assessmentError(409, 'This revision is already signed off.')
  const fieldErrors: Record<string, string> = {}
  if (row.chosenClassKeys.length === 0) fieldErrors.chosenClassKeys = 'Choose at least one respirator class before signing off.'
  if (!row.rationale.trim()) fieldErrors.rationale = 'Write the rationale before signing off.'
  if (Object.keys(fieldErrors).length) throw assessmentError(400, Object.values(fieldErrors)[0]!, fieldErrors)
  // Recomputed from the stored inputs: a class no longer adequate cannot be signed off.
  evaluateForSave({ title: row.title, siteId: row.siteId, input: row.input, chosenClassKeys: row.chosenClassKeys, rationale: row.rationale }, row.ruleSet === 'uk-hse' ? 'uk-hse' : 'us-osha')
  const a = schema.exposureAssessments
  await useDb().transaction(async (tx) => {
    await tx.update(a).set({ status: 'superseded' })
      .where(and(eq(a.organizationId, caller.organizationId), eq(a.recordId, row.recordId), eq(a.status, 'signed-off')))
    const [signed] = await tx.update(a).set({ status: 'signed-off', signedOffByUserId: caller.id, signedOffAt: new Date(), version: row.version + 1 })
      .where(and(eq(a.id, row.id), eq(a.status, 'draft'))).returning()
    if (!signed) throw assessmentError(409, 'This revision changed while you signed it off. Reload and try again.')
    await writeAudit(tx, caller, { entityType: 'exposure-assessment', entityId: row.id, action: 'sign-off', before: row, after: signed })
  })
  return { id: row.id, status: 'signed-off' as const }
})
