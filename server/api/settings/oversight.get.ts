import { reminderSettingsOf } from '#shared/utils/oversight'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const org = await findOrganization(caller.organizationId)
  return { reminders: reminderSettingsOf(org.settings.reminders), clearanceAtStart: org.settings.clearanceAtStart ?? 'flag' }
})
