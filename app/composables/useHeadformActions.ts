import type { z } from 'zod'
import type { headformTestSchema } from '#shared/utils/mask-schemas'

/** Recording a headform test; the unit's page and the testable list refresh. */
export function useHeadformActions() {
  return {
    async record(input: z.output<typeof headformTestSchema>) {
      const saved = await $fetch('/api/headform-tests', { method: 'POST', body: input })
      await Promise.all([refreshNuxtData(`mask-unit-${input.maskUnitId}`), refreshNuxtData('mask-units-testable')])
      return saved
    }
  }
}
