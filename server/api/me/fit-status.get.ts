import { and, desc, eq } from 'drizzle-orm'
import { personFitStatus } from '#shared/utils/person-schemas'

/** A wearer's own standing: their latest passing record, its due date and fit card. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'wearer')
  const p = schema.people
  const [person] = await useDb().select().from(p).where(and(eq(p.organizationId, caller.organizationId), eq(p.userId, caller.id)))
  if (!person) return { linked: false as const }
  const t = schema.fitTests
  const [latest] = await useDb().select().from(t)
    .where(and(eq(t.organizationId, caller.organizationId), eq(t.personId, person.id), eq(t.status, 'finished'), eq(t.passed, true)))
    .orderBy(desc(t.performedAt)).limit(1)
  return {
    linked: true as const,
    fullName: person.fullName,
    status: personFitStatus(latest?.dueOn ?? null, todayUtc()),
    latest: latest ? { id: latest.id, performedAt: latest.performedAt, dueOn: latest.dueOn, respirator: `${latest.respiratorMake} ${latest.respiratorModel}`, size: latest.respiratorSize } : null
  }
})
