import type { LabField } from '#shared/utils/lab-setup'
import { LEAK_PRESETS, checkLabField, hasLabQuery, decodeLabQuery, encodeLabQuery, rewriteLabNumbers } from '#shared/utils/lab-setup'
import { plainTypedNumber } from '#shared/utils/number-reader'
import { findBuiltInProtocol } from '#shared/utils/compute'
import { useLabStore } from '~/stores/lab'

/**
 * The lab's set-up for a page: taken from the link when it carries one, written back into the
 * link as the trainer types (so the address bar is always the set-up to share). Numbers are read
 * with the organization's decimal mark; a link written in the other mark is rewritten value for
 * value once the organization's mark is known.
 */
export function useLabSetup() {
  const store = useLabStore()
  const route = useRoute()
  const router = useRouter()
  const decimalMark = useDecimalMark()
  const { data: numberFormat } = useNuxtData('number-format')
  if (hasLabQuery(route.query)) {
    const decoded = decodeLabQuery(route.query as Record<string, unknown>)
    store.setup = decoded.state
    store.notices = decoded.notices
    store.textMark = decoded.decimalMark
  }
  if (route.query.room === '1') store.classroom = true

  watch([decimalMark, () => Boolean(numberFormat.value)], ([mark, known]) => {
    if (!known || store.textMark === mark) return
    const rewritten = rewriteLabNumbers(store.setup, store.textMark, mark)
    store.setup = rewritten.state
    store.notices = [...store.notices, ...rewritten.notices]
    store.textMark = mark
  }, { immediate: true })

  let timer: ReturnType<typeof setTimeout> | undefined
  watch(() => [store.setup, store.classroom, store.textMark], () => {
    clearTimeout(timer)
    timer = setTimeout(() => {
      void router.replace({ query: { ...(route.query.lesson ? { lesson: route.query.lesson } : {}), ...encodeLabQuery(store.setup, store.textMark), ...(store.classroom ? { room: '1' } : {}) } })
    }, 250)
  }, { deep: true })
  onScopeDispose(() => clearTimeout(timer))

  const protocol = computed(() => findBuiltInProtocol(store.setup.protocolKey) ?? findBuiltInProtocol('osha-standard')!)
  /** Each field's value, or null and its message; pages show the message beside the field. */
  function checked(field: LabField, text: string) {
    const r = checkLabField(field, text, store.textMark)
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
    store.setup.trueFactors = Object.fromEntries(Object.entries(factors).map(([k, v]) => [k, plainTypedNumber(v, store.textMark)]))
  }
  return { store, protocol, checked, runInput, resetFactors, decimalMark: computed(() => store.textMark) }
}
