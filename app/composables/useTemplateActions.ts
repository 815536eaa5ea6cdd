import type { ReadinessTemplate } from '#shared/utils/readiness-schemas'

/** Mutations of the readiness templates page; each refreshes the template list. */
export function useTemplateActions() {
  const refresh = () => refreshNuxtData('readiness-templates')
  return {
    async save(id: string | null, input: ReadinessTemplate) {
      const saved = id
        ? await $fetch(`/api/readiness-templates/${id}`, { method: 'PATCH', body: { name: input.name, steps: input.steps } })
        : await $fetch('/api/readiness-templates', { method: 'POST', body: input })
      await refresh()
      return saved
    },
    async setActive(id: string, active: boolean) {
      const saved = await $fetch(`/api/readiness-templates/${id}`, { method: 'PATCH', body: { active } })
      await refresh()
      return saved
    }
  }
}
