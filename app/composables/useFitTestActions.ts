import type { FitTestEntry, PreTestChecks } from '#shared/utils/fit-test-schemas'

export interface DraftSave {
  version: number
  entry?: FitTestEntry
  preTest?: PreTestChecks
  respiratorSize?: string
  seriesText?: string | null
}

/** Mutations of one fit test; each refreshes the page's data. */
export function useFitTestActions(id: string, key: string) {
  const refresh = () => refreshNuxtData([key, 'fit-test-list'])
  return {
    async save(changes: DraftSave) {
      return $fetch<{ version: number }>(`/api/fit-tests/${id}`, { method: 'PATCH', body: changes })
    },
    async finish(version: number) {
      const done = await $fetch(`/api/fit-tests/${id}/finish`, { method: 'POST', body: { version } })
      await refresh()
      return done
    },
    async startRevision(reason: string) {
      return $fetch<{ id: string }>(`/api/fit-tests/${id}/revisions`, { method: 'POST', body: { reason } })
    },
    async withdraw(reason: string) {
      const done = await $fetch(`/api/fit-tests/${id}/withdraw`, { method: 'POST', body: { reason } })
      await refresh()
      return done
    }
  }
}
