import { and, eq } from 'drizzle-orm'
import { createFitTestSchema } from '#shared/utils/fit-test-schemas'
import { localDay } from '#shared/utils/clock'
import { blankExerciseEntries } from '#shared/utils/fit-test-evaluate'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const input = await parseBody(event, createFitTestSchema)
  const t = schema.fitTests
  const existing = await useDb().select({ id: t.id }).from(t).where(and(eq(t.organizationId, caller.organizationId), eq(t.idempotencyKey, input.idempotencyKey)))
  if (existing[0]) return fitTestView(caller, await findFitTest(caller.organizationId, existing[0].id))

  const refs = await resolveReferences(caller.organizationId, input)
  await assertMaskUnitChoice(caller.organizationId, input)
  const org = await findOrganization(caller.organizationId)
  const protocol = protocolFor(input.protocolKey, input.kind, org)
  const performedAt = input.performedAt ? new Date(input.performedAt) : new Date()
  const clearanceAtStart = await clearanceAtStartFor(org, refs.person.id, refs.model.respiratorClass, localDay(performedAt, refs.site.timeZone), input.clearanceReason)
  const draft = {
    organizationId: caller.organizationId,
    recordId: crypto.randomUUID(),
    idempotencyKey: input.idempotencyKey,
    kind: input.kind,
    personId: refs.person.id,
    siteId: refs.site.id,
    testerUserId: caller.id,
    counterId: refs.counter?.id ?? null,
    respiratorModelId: refs.model.id,
    respiratorMake: refs.model.make,
    respiratorModel: refs.model.model,
    respiratorClass: refs.model.respiratorClass,
    respiratorSize: input.respiratorSize,
    maskUnitId: input.maskUnitId,
    protocolKey: input.protocolKey,
    protocol,
    sampleFlowCm3PerMin: refs.counter?.sampleFlowCm3PerMin ?? null,
    performedAt,
    clearanceAtStart,
    preTest: input.preTest,
    entry: input.entry ?? { mode: input.kind === 'qualitative' ? 'qualitative' as const : 'grid' as const, exercises: protocol ? blankExerciseEntries(protocol) : [], wholeTestAmbient: null, seriesOffsetSeconds: 0, qualitative: null },
    seriesText: input.seriesText ?? null
  }
  const { stored } = computeStoredResult(draft, org, refs.site.timeZone)
  const created = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(t).values({ ...draft, ...stored, seriesSha256: sha256OrNull(draft.seriesText) })
      .onConflictDoNothing({ target: [t.organizationId, t.idempotencyKey] }).returning()
    if (row) await writeAudit(tx, caller, { entityType: 'fit-test', entityId: row.id, action: 'created', after: { personId: row.personId, respirator: `${row.respiratorMake} ${row.respiratorModel} ${row.respiratorSize}`, protocolKey: row.protocolKey } })
    return row
  })
  // A retry that raced the first request lands here: answer with the row the first one made.
  const row = created ?? (await useDb().select().from(t).where(and(eq(t.organizationId, caller.organizationId), eq(t.idempotencyKey, input.idempotencyKey))))[0]!
  setResponseStatus(event, created ? 201 : 200)
  return fitTestView(caller, row)
})
