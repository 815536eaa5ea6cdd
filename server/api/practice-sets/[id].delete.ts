import { and, count, eq } from 'drizzle-orm'
import { idParamSchema } from '#shared/utils/user-schemas'

/** Clears a practice set: its practice people and practice tests go with it, in one audited step. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'clear-practice')
  const { id } = parseParams(event, idParamSchema)
  const set = await findPracticeSet(caller.organizationId, id)
  const db = useDb()
  const cleared = await db.transaction(async (tx) => {
    const [people] = await tx.select({ n: count() }).from(schema.practicePeople).where(eq(schema.practicePeople.practiceSetId, id))
    const [tests] = await tx.select({ n: count() }).from(schema.practiceTests).where(eq(schema.practiceTests.practiceSetId, id))
    const gone = await tx.delete(schema.practiceSets).where(and(eq(schema.practiceSets.organizationId, caller.organizationId), eq(schema.practiceSets.id, id))).returning({ id: schema.practiceSets.id })
    if (!gone.length) return null
    const summary = { name: set.name, practicePeople: people?.n ?? 0, practiceTests: tests?.n ?? 0 }
    await writeAudit(tx, caller, { entityType: 'practice-set', entityId: id, action: 'cleared', before: summary })
    return summary
  })
  if (!cleared) throw httpError(404, 'No such practice set in your organization.')
  return { cleared }
})
