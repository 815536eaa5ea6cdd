import { and, eq } from 'drizzle-orm'
import type { Protocol } from '#shared/utils/compute'
import { updatePracticeTestSchema } from '#shared/utils/practice-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'use-lab')
  const { id } = parseParams(event, idParamSchema)
  const { version, ...changes } = await parseBody(event, updatePracticeTestSchema)
  const before = await findPracticeTest(caller.organizationId, id)
  if (before.status !== 'draft') throw httpError(409, 'This practice test is finished. Start a new practice test to try again.')
  if (before.version !== version) throw practiceStaleError()
  assertEntryFits(before.protocol as Protocol, changes.entry)
  const next = { ...before, entry: changes.entry ?? before.entry, seriesText: changes.seriesText === undefined ? before.seriesText : changes.seriesText }
  const t = schema.practiceTests
  const [row] = await useDb().update(t).set({ entry: next.entry, seriesText: next.seriesText, ...evaluatePractice(next).stored, version: before.version + 1 })
    .where(and(eq(t.id, id), eq(t.organizationId, caller.organizationId), eq(t.version, version), eq(t.status, 'draft'))).returning()
  if (!row) throw practiceStaleError()
  return practiceTestView(caller.organizationId, row)
})
