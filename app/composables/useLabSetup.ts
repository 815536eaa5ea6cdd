import type { LabField } from '#shared/utils/lab-setup'
import { LEAK_PRESETS, checkLabField, hasLabQuery, decodeLabQuery, encodeLabQuery } from '#shared/utils/lab-setup'
import { findBuiltInProtocol } from '#shared/utils/compute'
import { useLabStore } from '~/stores/lab'

/**
 * The lab's set-up for a page: taken from the link when it carries one, written back into the
 * link as the trainer types (so the address bar is always the set-up to share).
 */
export function useLabSetup() {
  const store = useLabStore()
  const route = useRoute()
  const router = useRouter()
  if (hasLabQuery(route.query)) {
    const decoded = decodeLabQuery(route.query as Record<string, unknown>)
    store.setup = decoded.state
    store.notices = decoded.notices
  }
  if (route.query.room === '1') store.classroom = true

  let timer: ReturnType<typeof setTimeout> | undefined
  watch(() => [store.setup, store.classroom], () => {
    clearTimeout(timer)
    timer = setTimeout(() => {
      void router.replace({ query: { ...(route.query.lesson ? { lesson: route.query.lesson } : {}), ...encodeLabQuery(store.setup), ...(store.classroom ? { room: '1' } : {}) } })
    }, 250)
  }, { deep: true })
  onScopeDispose(() => clearTimeout(timer))

  const protocol = computed(() => findBuiltInProtocol(store.setup.protocolKey) ?? findBuiltInProtocol('osha-standard')!)
  /** Each field's value, or null and its message; pages show the message beside the field. */
  function checked(field: LabField, text: string) {
    const r = checkLabField(field, text)
    return r.ok ? { value: r.value, message: null } : { value: null, message: r.message }
  }
  /** The simulated test's inputs, or null while a field above needs correcting. */
  const runInput = computed(() => {
    const st = store.setup
    const values = {
      passLevel: checked('passLevel', st.passLevel).value,
      ambient: checked('ambient', st.ambient).value,
      sampleFlowCm3PerMin: checked('flow', st.flow).value,
      seed: checked('seed', st.seed).value,
      runs: checked('runs', st.runs).value
    }
    const trueFitFactors: Record<string, number> = {}
    for (const e of protocol.value.exercises.filter(x => x.counted)) {
      const v = checked('fitFactor', st.trueFactors[e.key] ?? '').value
      if (v === null) return null
      trueFitFactors[e.key] = v
    }
    if (values.passLevel === null || values.ambient === null || values.sampleFlowCm3PerMin === null || values.seed === null) return null
    return { protocolKey: protocol.value.key, trueFitFactors, passLevel: values.passLevel, ambient: values.ambient, sampleFlowCm3PerMin: values.sampleFlowCm3PerMin, seed: values.seed, runs: values.runs }
  })
  /** A new protocol has other exercises: start them from a good seal. */
  function resetFactors() {
    const factors = LEAK_PRESETS[0]!.factorsFor(protocol.value, runInput.value?.passLevel ?? 100)!
    store.setup.trueFactors = Object.fromEntries(Object.entries(factors).map(([k, v]) => [k, String(v)]))
  }
  return { store, protocol, checked, runInput, resetFactors }
}
