import { and, eq } from 'drizzle-orm'
import { finishPracticeTestSchema } from '#shared/utils/practice-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'use-lab')
  const { id } = parseParams(event, idParamSchema)
  const { version } = await parseBody(event, finishPracticeTestSchema)
  const row = await findPracticeTest(caller.organizationId, id)
  if (row.status !== 'draft') throw httpError(409, 'This practice test is already finished.')
  if (row.version !== version) throw practiceStaleError()
  const { evaluation, stored } = evaluatePractice(row)
  if (!evaluation.result.ok) {
    const first = evaluation.result.issues.find(i => i.severity === 'error')?.message ?? evaluation.seriesIssues.find(i => i.severity === 'error')?.message
    throw httpError(409, `The practice test cannot be finished yet: ${first ?? 'some results are missing'}.`)
  }
  const t = schema.practiceTests
  const done = await useDb().transaction(async (tx) => {
    const [updated] = await tx.update(t).set({ ...stored, status: 'finished', finishedAt: new Date(), version: row.version + 1 })
      .where(and(eq(t.id, id), eq(t.organizationId, caller.organizationId), eq(t.version, version), eq(t.status, 'draft'))).returning()
    if (updated) await writeAudit(tx, caller, { entityType: 'practice-test', entityId: id, action: 'finished', after: stored })
    return updated
  })
  if (!done) throw practiceStaleError()
  return practiceTestView(caller.organizationId, done)
})
