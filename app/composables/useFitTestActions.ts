import type { CreateFitTest, FitTestEntry, PreTestChecks } from '#shared/utils/fit-test-schemas'

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
    /** `keepalive` lets the request finish after the page is gone (a reload or a closed tab). */
    async save(changes: DraftSave, keepalive = false) {
      return $fetch(`/api/fit-tests/${id}`, { method: 'PATCH', body: changes, keepalive })
    },
    /** The version the server holds now (a reload may have read the draft before the last save landed). */
    async currentVersion() {
      return (await $fetch(`/api/fit-tests/${id}`)).version
    },
    async finish(version: number) {
      const done = await $fetch(`/api/fit-tests/${id}/finish`, { method: 'POST', body: { version } })
      await refresh()
      return done
    },
    async startRevision(reason: string) {
      return $fetch(`/api/fit-tests/${id}/revisions`, { method: 'POST', body: { reason } })
    },
    /** Opens a linked draft for a failed result; the same key twice gives the same draft. */
    async retest(idempotencyKey: string) {
      const draft = await $fetch(`/api/fit-tests/${id}/retest`, { method: 'POST', body: { idempotencyKey } })
      await refreshNuxtData('fit-test-list')
      return draft
    },
    async discard(reason: string) {
      const done = await $fetch(`/api/fit-tests/${id}/discard`, { method: 'POST', body: { reason } })
      await refresh()
      return done
    },
    async withdraw(reason: string) {
      const done = await $fetch(`/api/fit-tests/${id}/withdraw`, { method: 'POST', body: { reason } })
      await refresh()
      return done
    }
  }
}

/** Starting a fit test; the list refreshes when it is next shown. */
export function useNewFitTestActions() {
  return {
    async create(input: CreateFitTest) {
      const created = await $fetch('/api/fit-tests', { method: 'POST', body: input })
      await refreshNuxtData('fit-test-list')
      return created
    }
  }
}
