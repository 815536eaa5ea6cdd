import type { SaveAssessmentInput } from '#shared/utils/exposure-schemas'

/** Every change to exposure assessments; each refreshes what it touched. */
export function useExposureAssessmentActions() {
  async function refresh(id?: string) {
    await refreshNuxtData(['exposure-assessments', 'exposure-gaps-all', ...(id ? [`exposure-assessment-${id}`] : [])])
  }
  return {
    async create(body: SaveAssessmentInput) {
      const reply = await $fetch('/api/exposure-assessments', { method: 'POST', body })
      await refresh()
      return reply
    },
    async update(id: string, body: SaveAssessmentInput & { version: number }) {
      const reply = await $fetch(`/api/exposure-assessments/${id}`, { method: 'PATCH', body })
      await refresh(id)
      return reply
    },
    async signOff(id: string) {
      await $fetch(`/api/exposure-assessments/${id}/sign-off`, { method: 'POST' })
      await refresh(id)
    },
    async revise(id: string, reason: string) {
      const reply = await $fetch(`/api/exposure-assessments/${id}/revisions`, { method: 'POST', body: { reason } })
      await refresh(id)
      return reply
    },
    async assign(id: string, body: { personId?: string, jobTitle?: string }) {
      await $fetch(`/api/exposure-assessments/${id}/assignments`, { method: 'POST', body })
      await refresh(id)
    },
    async unassign(id: string, assignmentId: string) {
      await $fetch(`/api/exposure-assessments/${id}/assignments/${assignmentId}`, { method: 'DELETE' })
      await refresh(id)
    }
  }
}
