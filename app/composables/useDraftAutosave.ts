import { useDebounceFn, useDocumentVisibility, useEventListener, useOnline } from '@vueuse/core'

export type AutosaveState = 'saved' | 'saving' | 'offline' | 'error'

/**
 * Autosave for anything typed at the bench. `changed()` after every edit saves once typing has
 * been still for `delayMs`; `flush()` saves at once. It also flushes when a field loses focus
 * (the caller wires that), when the page is hidden, before the page unloads (a keepalive request,
 * which the browser finishes after the page is gone) and when the network comes back.
 * `send(keepalive)` saves whatever is unsaved and throws when it could not.
 */
export function useDraftAutosave(options: { isDirty: () => boolean, send: (keepalive: boolean) => Promise<void>, delayMs?: number }) {
  const state = ref<AutosaveState>('saved')
  const message = ref('')
  const online = useOnline()
  const visibility = useDocumentVisibility()
  let inFlight: Promise<void> = Promise.resolve()
  let sending = false

  async function run(keepalive: boolean) {
    if (!options.isDirty()) {
      if (!sending && state.value !== 'error') state.value = 'saved'
      return
    }
    if (!online.value) {
      state.value = 'offline'
      return
    }
    sending = true
    state.value = 'saving'
    try {
      await options.send(keepalive)
      message.value = ''
      state.value = options.isDirty() ? 'saving' : 'saved'
    } catch (error) {
      // A dropped connection is not the tester's mistake: keep the typing and wait for the network.
      state.value = online.value ? 'error' : 'offline'
      message.value = online.value ? apiErrorOf(error).message : ''
    } finally {
      sending = false
    }
  }

  /** Saves now, after any save already on its way (one version at a time). */
  function flush(keepalive = false): Promise<void> {
    // Started at once when nothing is on its way, so a flush from `pagehide` leaves before the page goes.
    inFlight = sending ? inFlight.then(() => run(keepalive)) : run(keepalive)
    return inFlight
  }
  const later = useDebounceFn(() => flush(), options.delayMs ?? 700)

  function changed() {
    if (state.value !== 'offline') state.value = 'saving'
    void later()
  }

  watch(visibility, (now) => {
    if (now === 'hidden') void flush(true)
  })
  watch(online, (now) => {
    if (now) void flush()
    else if (options.isDirty()) state.value = 'offline'
  })
  if (import.meta.client) {
    useEventListener(window, 'pagehide', () => {
      void flush(true)
    })
  }
  onBeforeUnmount(() => {
    void flush()
  })

  return { state, message, online, changed, flush, settled: () => inFlight }
}
