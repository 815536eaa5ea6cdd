/**
 * Runs today's scheduled reminders for the caller's organization now, as the daily job would.
 * Safe to call from several instances at once: each step is claimed once in the reminder log.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  return runScheduledReminders(caller.organizationId, await programToday(caller.organizationId))
})
