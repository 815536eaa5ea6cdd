import type { z } from 'zod'
import type { respiratorModelSchema } from '#shared/utils/respirator-schemas'

/** Mutations of the respirator catalogue; each refreshes the catalogue list. */
export function useCatalogueActions() {
  const refresh = () => refreshNuxtData(['catalogue', 'respirator-models'])
  return {
    async createModel(input: z.output<typeof respiratorModelSchema>) {
      const model = await $fetch('/api/respirator-models', { method: 'POST', body: input })
      await refresh()
      return model
    },
    async setModelActive(id: string, active: boolean) {
      const model = await $fetch(`/api/respirator-models/${id}`, { method: 'PATCH', body: { active } })
      await refresh()
      return model
    }
  }
}
