import PgBoss from 'pg-boss'

const QUEUE = 'daily-reminders'

/**
 * Starts the PostgreSQL job queue (pg-boss) that sends the daily reminders. Every app instance
 * starts it; pg-boss hands each scheduled job to one worker, and the reminder log's unique index
 * makes a step go out once even if two instances run the sweep on the same day.
 */
export default defineNitroPlugin((nitroApp) => {
  const config = useRuntimeConfig()
  if (!config.databaseUrl || config.reminderQueue === false || String(config.reminderQueue) === 'false' || import.meta.prerender) return
  const boss = new PgBoss({ connectionString: config.databaseUrl, max: 2 })
  boss.on('error', error => console.error('Reminder queue:', error.message))
  const started = (async () => {
    await boss.start()
    await boss.createQueue(QUEUE)
    // 06:15 UTC every day; the job itself decides each organization's due steps.
    await boss.schedule(QUEUE, '15 6 * * *', {}, { tz: 'UTC' })
    await boss.work(QUEUE, async () => {
      const result = await runAllScheduledReminders()
      console.log(`Reminders sent: ${result.wearerMails} to wearers, ${result.digests} digests.`)
    })
  })().catch(error => console.error('The reminder queue did not start:', (error as Error).message))
  nitroApp.hooks.hook('close', async () => {
    await started
    await boss.stop({ graceful: false, wait: false }).catch(() => {})
  })
})
