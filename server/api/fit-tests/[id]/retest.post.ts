import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { localDay } from '#shared/utils/clock'
import { blankExerciseEntries } from '#shared/utils/fit-test-evaluate'
import { createFitTestSchema } from '#shared/utils/fit-test-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

const retestSchema = z.object({
  idempotencyKey: z.string({ error: 'The idempotency key is missing.' }).min(8, { error: 'The idempotency key is too short.' }).max(100),
  clearanceReason: createFitTestSchema.shape.clearanceReason
})

/** Opens a new draft for the same person, respirator, size, protocol, site and counter, linked to the failed record. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, retestSchema)
  const failed = await findFitTest(caller.organizationId, id)
  if (failed.status !== 'finished' || failed.passed !== false) throw httpError(409, 'Only a finished test that did not pass can be retested from here. Start a new test instead.')
  const t = schema.fitTests
  const [existing] = await useDb().select({ id: t.id }).from(t).where(and(eq(t.organizationId, caller.organizationId), eq(t.idempotencyKey, input.idempotencyKey)))
  if (existing) return fitTestView(caller, await findFitTest(caller.organizationId, existing.id))
  const [org, site] = await Promise.all([findOrganization(caller.organizationId), findSite(caller.organizationId, failed.siteId)])
  const performedAt = new Date()
  const clearanceAtStart = await clearanceAtStartFor(org, failed.personId, failed.respiratorClass, localDay(performedAt, site.timeZone), input.clearanceReason)
  const protocol = failed.protocol
  const draft = {
    organizationId: caller.organizationId, recordId: crypto.randomUUID(), idempotencyKey: input.idempotencyKey, kind: failed.kind,
    personId: failed.personId, siteId: failed.siteId, testerUserId: caller.id, counterId: failed.counterId,
    respiratorModelId: failed.respiratorModelId, respiratorMake: failed.respiratorMake, respiratorModel: failed.respiratorModel,
    respiratorClass: failed.respiratorClass, respiratorSize: failed.respiratorSize, protocolKey: failed.protocolKey, protocol,
    sampleFlowCm3PerMin: failed.sampleFlowCm3PerMin, performedAt, clearanceAtStart, retestOfRecordId: failed.recordId,
    // Pre-test items are confirmed afresh for every test.
    preTest: { medicalClearanceCurrent: false, nothingCrossingSeal: false, userSealCheckDone: false, comfortAcceptable: false },
    entry: { mode: failed.kind === 'qualitative' ? 'qualitative' as const : 'grid' as const, exercises: protocol ? blankExerciseEntries(protocol) : [], wholeTestAmbient: null, seriesOffsetSeconds: 0, qualitative: null },
    seriesText: null
  }
  const { stored } = computeStoredResult(draft, org, site.timeZone)
  const row = await useDb().transaction(async (tx) => {
    const [created] = await tx.insert(t).values({ ...draft, ...stored }).onConflictDoNothing({ target: [t.organizationId, t.idempotencyKey] }).returning()
    if (created) await writeAudit(tx, caller, { entityType: 'fit-test', entityId: created.id, action: 'created', after: { retestOf: failed.id, personId: failed.personId } })
    return created
  })
  const final = row ?? (await useDb().select().from(t).where(and(eq(t.organizationId, caller.organizationId), eq(t.idempotencyKey, input.idempotencyKey))))[0]!
  setResponseStatus(event, row ? 201 : 200)
  return fitTestView(caller, final)
})
