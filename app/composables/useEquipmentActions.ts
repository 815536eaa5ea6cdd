import type { BenchRigInput, CounterInput } from '#shared/utils/equipment-schemas'

/** Mutations of the counters and bench rigs page; each refreshes the lists it changed. */
export function useEquipmentActions() {
  const refresh = () => Promise.all([refreshNuxtData('counters'), refreshNuxtData('bench-rigs')])
  async function send<T>(url: string, method: 'POST' | 'PATCH', body: unknown) {
    const row = await $fetch<T>(url, { method, body: body as Record<string, unknown> })
    await refresh()
    return row
  }
  return {
    createCounter: (input: CounterInput) => send('/api/counters', 'POST', input),
    updateCounter: (id: string, changes: Partial<CounterInput> & { active?: boolean }) => send(`/api/counters/${id}`, 'PATCH', changes),
    createRig: (input: BenchRigInput) => send('/api/bench-rigs', 'POST', input),
    updateRig: (id: string, changes: Partial<BenchRigInput> & { active?: boolean }) => send(`/api/bench-rigs/${id}`, 'PATCH', changes)
  }
}
