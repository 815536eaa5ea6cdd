import type { LabField } from '#shared/utils/lab-setup'
import { checkLabField, decodeLabQuery, encodeLabQuery } from '#shared/utils/lab-setup'
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
  if (Object.keys(route.query).some(k => k !== 'room')) {
    const decoded = decodeLabQuery(route.query as Record<string, unknown>)
    store.setup = decoded.state
    store.notices = decoded.notices
  }
  if (route.query.room === '1') store.classroom = true

  let timer: ReturnType<typeof setTimeout> | undefined
  watch(() => [store.setup, store.classroom], () => {
    clearTimeout(timer)
    timer = setTimeout(() => {
      void router.replace({ query: { ...encodeLabQuery(store.setup), ...(store.classroom ? { room: '1' } : {}) } })
    }, 250)
  }, { deep: true })
  onScopeDispose(() => clearTimeout(timer))

  const protocol = computed(() => findBuiltInProtocol(store.setup.protocolKey) ?? findBuiltInProtocol('osha-standard')!)
  /** Each field's value, or null and its message; pages show the message beside the field. */
  function checked(field: LabField, text: string) {
    const r = checkLabField(field, text)
    return r.ok ? { value: r.value, message: null } : { value: null, message: r.message }
  }
  return { store, protocol, checked }
}
