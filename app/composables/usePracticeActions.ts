import type { FitTestEntry } from '#shared/utils/fit-test-schemas'
import type { CreatePracticeTest } from '#shared/utils/practice-schemas'

/** Every change to practice goes through here, then refreshes what the page shows. */
export function usePracticeActions(refreshKey?: string) {
  const refresh = () => refreshKey ? refreshNuxtData(refreshKey) : Promise.resolve()
  return {
    async createSet(name: string) {
      const set = await $fetch('/api/practice-sets', { method: 'POST', body: { name } })
      await refresh()
      return set
    },
    async addPerson(practiceSetId: string, fullName: string) {
      await $fetch('/api/practice-people', { method: 'POST', body: { practiceSetId, fullName } })
      await refresh()
    },
    async startTest(body: CreatePracticeTest) {
      return $fetch('/api/practice-tests', { method: 'POST', body })
    },
    async clearSet(id: string) {
      const reply = await $fetch(`/api/practice-sets/${id}`, { method: 'DELETE' })
      await refresh()
      return reply.cleared
    },
    save(id: string, body: { version: number, entry: FitTestEntry, seriesText?: string | null }) {
      return $fetch(`/api/practice-tests/${id}`, { method: 'PATCH', body })
    },
    async finish(id: string, version: number) {
      await $fetch(`/api/practice-tests/${id}/finish`, { method: 'POST', body: { version } })
      await refresh()
    }
  }
}
