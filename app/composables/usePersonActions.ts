import type { z } from 'zod'
import type { clearanceSchema } from '#shared/utils/oversight-schemas'
import type { PersonInput } from '#shared/utils/person-schemas'

/** Adds a person to the roster and refreshes it. */
export async function createPerson(input: PersonInput) {
  const person = await $fetch<{ id: string }>('/api/people', { method: 'POST', body: input })
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
  return {
    update: (changes: Partial<PersonInput> & { reminderOptOut?: boolean }) => then($fetch(`/api/people/${personId}`, { method: 'PATCH', body: changes })),
    assignRespirator: (respiratorModelId: string) => then($fetch(`/api/people/${personId}/respirators`, { method: 'POST', body: { respiratorModelId } })),
    unassignRespirator: (modelId: string) => then($fetch(`/api/people/${personId}/respirators/${modelId}`, { method: 'DELETE' })),
    addClearance: (input: z.output<typeof clearanceSchema>) => then($fetch(`/api/people/${personId}/clearances`, { method: 'POST', body: input })),
    linkAccount: (body: Record<string, unknown>) => then($fetch(`/api/people/${personId}/link`, { method: 'POST', body })),
    unlinkAccount: () => then($fetch(`/api/people/${personId}/unlink`, { method: 'POST', body: {} })),
    previewReminder: () => useReminderActions().preview([personId]),
    sendReminder: () => then(useReminderActions().send([personId]))
  }
}
