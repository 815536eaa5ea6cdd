export interface ReminderResult { personId: string, fullName: string, to: string | null, skipped: string | null, message: { subject: string, text: string } | null }

/** Reminder previews and sends from the due list; a send refreshes the due list. */
export function useReminderActions() {
  return {
    preview: (personIds: string[]) => $fetch<{ sent: number, results: ReminderResult[] }>('/api/reminders/preview', { method: 'POST', body: { personIds } }),
    async send(personIds: string[]) {
      const reply = await $fetch<{ sent: number, results: ReminderResult[] }>('/api/reminders/send', { method: 'POST', body: { personIds } })
      // The reply is shown at once; the due list catches up behind it.
      void refreshNuxtData('due-list')
      return reply
    }
  }
}
