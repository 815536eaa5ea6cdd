import type { z } from 'zod'
import type { clearanceSchema } from '#shared/utils/oversight-schemas'
import type { PersonInput } from '#shared/utils/person-schemas'

/** Adds a person to the roster and refreshes it. */
export async function createPerson(input: PersonInput) {
  const person = await $fetch('/api/people', { method: 'POST', body: input })
  await refreshNuxtData('people-list')
  return person
}

/** Mutations of one person's pages; each refreshes the person's record (and the roster). */
export function usePersonActions(personId: string, dataKey = `person-${personId}`) {
  const refresh = () => refreshNuxtData([dataKey, 'people-list'])
  async function then<T>(done: Promise<T>) {
    const value = await done
    await refresh()
    return value
  }
  // A plain string address keeps the compiler out of Nitro's route-type inference for each path.
  const call = (path: string, method: 'POST' | 'PATCH' | 'DELETE', body?: Record<string, unknown>) => then($fetch<unknown>(`/api/people/${personId}${path}`, { method, body }))
  return {
    update: (changes: Partial<PersonInput> & { reminderOptOut?: boolean }) => call('', 'PATCH', changes),
    assignRespirator: (respiratorModelId: string) => call('/respirators', 'POST', { respiratorModelId }),
    unassignRespirator: (modelId: string) => call(`/respirators/${modelId}`, 'DELETE'),
    addClearance: (input: z.output<typeof clearanceSchema>) => call('/clearances', 'POST', input as Record<string, unknown>),
    linkAccount: (body: Record<string, unknown>) => call('/link', 'POST', body),
    unlinkAccount: () => call('/unlink', 'POST', {}),
    previewReminder: () => useReminderActions().preview([personId]),
    sendReminder: () => then(useReminderActions().send([personId]))
  }
}
