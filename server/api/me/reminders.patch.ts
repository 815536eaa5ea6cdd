import { and, eq } from 'drizzle-orm'
import { optOutSchema } from '#shared/utils/oversight-schemas'

/** A wearer turns reminder e-mail off or on for themselves. They stay on every due list. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'own-status')
  const { reminderOptOut } = await parseBody(event, optOutSchema)
  const p = schema.people
  const updated = await useDb().transaction(async (tx) => {
    const [row] = await tx.update(p).set({ reminderOptOut }).where(and(eq(p.organizationId, caller.organizationId), eq(p.userId, caller.id))).returning({ id: p.id })
    if (row) await writeAudit(tx, caller, { entityType: 'person', entityId: row.id, action: reminderOptOut ? 'reminders-off' : 'reminders-on' })
    return row
  })
  if (!updated) throw httpError(404, 'Your account is not linked to a roster entry yet.')
  return { reminderOptOut }
})
