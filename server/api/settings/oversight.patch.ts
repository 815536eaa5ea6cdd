import { sql } from 'drizzle-orm'
import { z } from 'zod'
import { reminderSettingsOf } from '#shared/utils/oversight'
import { CLEARANCE_AT_START, reminderSettingsSchema } from '#shared/utils/oversight-schemas'

const bodySchema = z.object({
  reminders: reminderSettingsSchema.optional(),
  clearanceAtStart: z.enum(CLEARANCE_AT_START, { error: 'Choose one of the listed options.' }).optional()
})

/** Reminder and clearance-check settings, merged into the organization's settings without touching the rest. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const changes = await parseBody(event, bodySchema)
  const patch = Object.fromEntries(Object.entries(changes).filter(([, v]) => v !== undefined))
  const org = await findOrganization(caller.organizationId)
  const after = await useDb().transaction(async (tx) => {
    // jsonb || merges at the top level in one statement, so a concurrent edit of other settings survives.
    const [row] = await tx.update(schema.organizations).set({ settings: sql`${schema.organizations.settings} || ${JSON.stringify(patch)}::jsonb` })
      .where(sql`${schema.organizations.id} = ${caller.organizationId}`).returning()
    await writeAudit(tx, caller, { entityType: 'organization', entityId: caller.organizationId, action: 'settings-updated', before: { reminders: org.settings.reminders, clearanceAtStart: org.settings.clearanceAtStart }, after: patch })
    return row!.settings
  })
  return { reminders: reminderSettingsOf(after.reminders), clearanceAtStart: after.clearanceAtStart ?? 'flag' }
})
