import { and, eq } from 'drizzle-orm'
import { findBuiltInProtocol } from '#shared/utils/compute'
import { blankExerciseEntries } from '#shared/utils/fit-test-evaluate'
import { createPracticeTestSchema } from '#shared/utils/practice-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'use-lab')
  const input = await parseBody(event, createPracticeTestSchema)
  const t = schema.practiceTests
  const [existing] = await useDb().select().from(t).where(and(eq(t.organizationId, caller.organizationId), eq(t.idempotencyKey, input.idempotencyKey)))
  if (existing) return practiceTestView(caller.organizationId, existing)

  const person = await findPracticePerson(caller.organizationId, input.practicePersonId)
  const protocol = findBuiltInProtocol(input.protocolKey)!
  // The organization's own pass level for the class, as on a real test.
  const passLevel = passLevelFor(await findOrganization(caller.organizationId), input.respiratorClass).level
  const draft = {
    organizationId: caller.organizationId, practiceSetId: person.practiceSetId, practicePersonId: person.id, traineeUserId: caller.id,
    idempotencyKey: input.idempotencyKey, respiratorClass: input.respiratorClass, protocolKey: protocol.key, protocol,
    sampleFlowCm3PerMin: input.sampleFlowCm3PerMin, passLevel, seriesText: null,
    entry: { mode: 'grid' as const, exercises: blankExerciseEntries(protocol), wholeTestAmbient: null, seriesOffsetSeconds: 0, qualitative: null }
  }
  const created = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(t).values({ ...draft, ...evaluatePractice(draft).stored }).onConflictDoNothing().returning()
    if (row) await writeAudit(tx, caller, { entityType: 'practice-test', entityId: row.id, action: 'created', after: { practicePersonId: person.id, protocolKey: protocol.key } })
    return row
  })
  const row = created ?? (await useDb().select().from(t).where(and(eq(t.organizationId, caller.organizationId), eq(t.idempotencyKey, input.idempotencyKey))))[0]!
  setResponseStatus(event, created ? 201 : 200)
  return practiceTestView(caller.organizationId, row)
})
