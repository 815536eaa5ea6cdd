import type { ChangeMaskState, MaskUnitInput } from '#shared/utils/mask-schemas'

/** Mutations of the mask-unit pages; each refreshes what it changed. */
export function useMaskActions() {
  return {
    async createUnit(input: MaskUnitInput) {
      const unit = await $fetch('/api/mask-units', { method: 'POST', body: input })
      await refreshNuxtData('mask-units')
      return unit
    },
    async createType(input: Record<string, unknown>) {
      const type = await $fetch('/api/mask-types', { method: 'POST', body: input })
      await refreshNuxtData('mask-types')
      return type
    },
    async changeState(unitId: string, input: ChangeMaskState) {
      const unit = await $fetch(`/api/mask-units/${unitId}/state`, { method: 'POST', body: input })
      await Promise.all([refreshNuxtData(`mask-unit-${unitId}`), refreshNuxtData('mask-units')])
      return unit
    }
  }
}
