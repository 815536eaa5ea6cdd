import { and, eq, ne } from 'drizzle-orm'
import { finishFitTestSchema } from '#shared/utils/fit-test-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'
import { cardDecision, coverageFlagOf } from '#shared/utils/fit-card-rules'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const { version } = await parseBody(event, finishFitTestSchema)
  const row = await findFitTest(caller.organizationId, id)
  assertDraft(row)
  assertVersion(row, version)
  const org = await findOrganization(caller.organizationId)
  const site = await findSite(caller.organizationId, row.siteId)
  const { evaluation, stored } = computeStoredResult(row, org, site.timeZone)
  const firstError = evaluation?.result.issues.find(i => i.severity === 'error')?.message ?? evaluation?.seriesIssues.find(i => i.severity === 'error')?.message
  assertReadyToFinish(row, evaluation ? evaluation.result.ok : true, firstError)
  const coverage = row.counterId ? await findCoverage(caller.organizationId, { counterId: row.counterId, siteId: row.siteId, performedAt: row.performedAt }) : null
  if (coverage && !coverage.covered && org.settings.uncoveredResults === 'refuse') {
    throw httpError(409, `Your program refuses results no readiness check covers: ${coverage.message}`, { coverage })
  }
  await assertUsableMaskUnit(caller.organizationId, row)
  // A failed test gets no card and so no verification link.
  const card = cardDecision({ status: 'finished', passed: stored.passed, coverage: coverageFlagOf(coverage), uncoveredResults: org.settings.uncoveredResults })

  const t = schema.fitTests
  await useDb().transaction(async (tx) => {
    // Under the record lock: a withdrawal that landed while this correction was open stands.
    const revisions = await lockRecord(tx, caller.organizationId, row.recordId)
    if (revisions.some(r => r.status === 'withdrawn')) {
      throw httpError(409, 'This record was withdrawn while the correction was open; a correction does not reinstate it. Start a new fit test instead.')
    }
    const [done] = await tx.update(t).set({ ...stored, evaluation: evaluation ?? null, status: 'finished', finishedAt: new Date(), finishedByUserId: caller.id, version: row.version + 1 })
      .where(and(eq(t.id, id), eq(t.version, version), eq(t.status, 'draft'))).returning({ id: t.id })
    if (!done) throw staleDraftError()
    // A corrected revision replaces the one it corrects; the earlier stays readable as superseded.
    await tx.update(t).set({ status: 'superseded' })
      .where(and(eq(t.recordId, row.recordId), ne(t.id, id), eq(t.status, 'finished')))
    if (card.issue) await ensureCard(tx, caller.organizationId, row)
    await recordExerciseResults(tx, caller.organizationId, id, evaluation?.result)
    await refreshInsights(tx, caller.organizationId, row.recordId)
    await writeAudit(tx, caller, { entityType: 'fit-test', entityId: id, action: 'finished', after: { revision: row.revision, overallFitFactor: stored.overallFitFactor, passed: stored.passed, passLevel: stored.passLevel, dueOn: stored.dueOn } })
  })
  return fitTestView(caller, id)
})
