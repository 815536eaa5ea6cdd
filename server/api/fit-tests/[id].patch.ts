import { and, eq } from 'drizzle-orm'
import { updateFitTestSchema } from '#shared/utils/fit-test-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'
import { definedOnly } from '#shared/utils/patch-schema'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const { version, ...changes } = await parseBody(event, updateFitTestSchema)
  const before = await findFitTest(caller.organizationId, id)
  assertDraft(before)
  assertVersion(before, version)

  const counterId = changes.counterId === undefined ? before.counterId : changes.counterId
  const refs = await resolveReferences(caller.organizationId, { ...before, counterId, respiratorSize: changes.respiratorSize ?? before.respiratorSize })
  const next = {
    ...before,
    ...definedOnly(changes),
    // Only the pre-test items and entry parts that were sent change.
    preTest: { ...before.preTest, ...definedOnly(changes.preTest) },
    entry: { ...before.entry, ...definedOnly(changes.entry) },
    counterId,
    sampleFlowCm3PerMin: refs.counter?.sampleFlowCm3PerMin ?? null,
    performedAt: changes.performedAt ? new Date(changes.performedAt) : before.performedAt,
    seriesText: changes.seriesText === undefined ? before.seriesText : changes.seriesText
  }
  if (changes.maskUnitId !== undefined || changes.respiratorSize !== undefined) {
    await assertMaskUnitChoice(caller.organizationId, { respiratorModelId: before.respiratorModelId, respiratorSize: next.respiratorSize, maskUnitId: next.maskUnitId, revision: before.revision })
  }
  const { stored, evaluation } = computeStoredResult(next, await findOrganization(caller.organizationId), refs.site.timeZone)
  const t = schema.fitTests
  const saved = await useDb().transaction(async (tx) => {
    const [row] = await tx.update(t).set({
      respiratorSize: next.respiratorSize, maskUnitId: next.maskUnitId, counterId: next.counterId, sampleFlowCm3PerMin: next.sampleFlowCm3PerMin,
      performedAt: next.performedAt, preTest: next.preTest, entry: next.entry,
      seriesText: next.seriesText, seriesSha256: sha256OrNull(next.seriesText), ...stored, version: before.version + 1
    }).where(and(eq(t.id, id), eq(t.version, version), eq(t.status, 'draft'))).returning()
    if (!row) return null
    await writeAudit(tx, caller, { entityType: 'fit-test', entityId: id, action: 'draft-saved', before: { version: before.version }, after: { version: row.version, ...changes, seriesText: changes.seriesText ? `(${changes.seriesText.length} characters)` : changes.seriesText } })
    return row
  })
  // Another save won the race between our read and our write.
  if (!saved) throw staleDraftError()
  return draftSaved(saved, evaluation)
})
