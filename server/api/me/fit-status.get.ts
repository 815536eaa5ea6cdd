import { and, eq } from 'drizzle-orm'

/** A wearer's own standing: every respirator they are fitted for, each with its due date and fit card. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'own-status')
  const p = schema.people
  const [person] = await useDb().select().from(p).where(and(eq(p.organizationId, caller.organizationId), eq(p.userId, caller.id)))
  if (!person) return { linked: false as const }
  const standing = (await loadStandings(caller.organizationId, await programToday(caller.organizationId), [person.id]))(person.id)
  return {
    linked: true as const,
    fullName: person.fullName,
    status: standing.status,
    nextDueOn: standing.nextDueOn,
    clearance: { status: standing.clearance.status, validUntil: standing.clearance.validUntil },
    respirators: standing.respirators.map(r => ({
      key: r.respiratorKey,
      respirator: `${r.make} ${r.model}`,
      size: r.lastPass?.size ?? r.size,
      status: r.status,
      dueOn: r.dueOn,
      testedOn: r.lastPass?.testedOn ?? null,
      imported: r.lastPass?.source === 'imported',
      // A card only for a Sealwright pass that still stands; a later failure withdraws it from view.
      fitTestId: r.status !== 'failed' && r.lastPass?.source === 'sealwright' ? r.lastPass.fitTestId : null
    }))
  }
})
