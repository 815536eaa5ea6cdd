import { randomUUID } from 'node:crypto'
import { saveAssessmentSchema } from '#shared/utils/exposure-schemas'

/** Saves the calculator as a draft exposure assessment; the server recomputes every figure. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'review')
  const body = await parseBody(event, saveAssessmentSchema)
  const ruleSet = await assessmentRuleSetOf(caller.organizationId)
  const result = evaluateForSave(body, ruleSet)
  await assertAssessmentSite(caller.organizationId, body.siteId)
  const row = await useDb().transaction(async (tx) => {
    const [created] = await tx.insert(schema.exposureAssessments).values({
      organizationId: caller.organizationId, recordId: randomUUID(), title: body.title, siteId: body.siteId ?? null, ruleSet,
      input: body.input, chosenClassKeys: body.chosenClassKeys, rationale: body.rationale,
      requiredProtectionFactor: result.requiredProtectionFactor, idlhAtmosphere: result.idlhAtmosphere, createdByUserId: caller.id
    }).returning()
    await writeAudit(tx, caller, { entityType: 'exposure-assessment', entityId: created!.id, action: 'create', after: created })
    return created!
  })
  setResponseStatus(event, 201)
  return { id: row.id, recordId: row.recordId, version: row.version }
})
