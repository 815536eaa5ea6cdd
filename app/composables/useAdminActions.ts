import type { z } from 'zod'
import type { passLevelOverridesSchema } from '#shared/utils/pass-level-schemas'
import type { customProtocolSchema } from '#shared/utils/protocol-admin-schemas'

/** Mutations of the program admin's pass-level and protocol pages; each refreshes its list. */
export function useAdminActions() {
  return {
    async savePassLevels(input: z.output<typeof passLevelOverridesSchema>) {
      const saved = await $fetch('/api/pass-levels', { method: 'PUT', body: input })
      await refreshNuxtData('pass-levels')
      return saved
    },
    async createProtocol(input: z.output<typeof customProtocolSchema>) {
      const saved = await $fetch('/api/protocols', { method: 'POST', body: input })
      await refreshNuxtData('protocols')
      return saved
    },
    async removeProtocol(key: string) {
      await $fetch(`/api/protocols/${encodeURIComponent(key)}`, { method: 'DELETE' })
      await refreshNuxtData('protocols')
    }
  }
}
