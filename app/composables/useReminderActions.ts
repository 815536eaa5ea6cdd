/** Reminder previews and sends from the due list; a send refreshes the due list. */
export function useReminderActions() {
  return {
    preview: (personIds: string[]) => $fetch('/api/reminders/preview', { method: 'POST', body: { personIds } }),
    async send(personIds: string[]) {
      const reply = await $fetch('/api/reminders/send', { method: 'POST', body: { personIds } })
      // The reply is shown at once; the due list catches up behind it.
      void refreshNuxtData('due-list')
      return reply
    }
  }
}

/** One person's line in a reminder preview or send, as the route answers it. */
export type ReminderResult = Awaited<ReturnType<ReturnType<typeof useReminderActions>['preview']>>['results'][number]
