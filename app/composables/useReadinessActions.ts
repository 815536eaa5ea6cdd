import type { RecordStep, StartReadinessCheck } from '#shared/utils/readiness-schemas'

/** Runner mutations: each answer is the saved check, written straight into the page's data. */
export function useReadinessActions(key: string) {
  const data = useNuxtData(key)
  async function post(url: string, body: unknown = {}) {
    const check = await $fetch(url, { method: 'POST', body: body as Record<string, unknown> })
    data.data.value = check
    return check
  }
  return {
    start: (input: StartReadinessCheck) => $fetch('/api/readiness-checks', { method: 'POST', body: input }),
    record: (id: string, input: RecordStep) => post(`/api/readiness-checks/${id}/steps`, input),
    fail: (id: string) => post(`/api/readiness-checks/${id}/fail`),
    abandon: (id: string, reason: string) => post(`/api/readiness-checks/${id}/abandon`, { reason })
  }
}
