/**
 * A form that opens in place ("Abandon this check…", "Withdraw…"): opening focuses its first
 * field, Escape or Cancel closes it and gives the focus back to the button that opened it.
 */
export function useInlineDialog<T = true>() {
  const open = ref<T | null>(null) as Ref<T | null>
  const container = ref<HTMLElement | null>(null)
  /** The opener when it is re-rendered (a button hidden while the form is open). */
  const opener = ref<HTMLElement | null>(null)
  let returnTo: HTMLElement | null = null

  function show(what: T, event?: Event) {
    returnTo = (event?.currentTarget as HTMLElement | null) ?? (document.activeElement as HTMLElement | null)
    open.value = what
    nextTick(() => container.value?.querySelector<HTMLElement>('input, textarea, select')?.focus())
  }
  function close() {
    open.value = null
    nextTick(() => (returnTo?.isConnected ? returnTo : opener.value)?.focus())
  }
  function onKeydown(event: KeyboardEvent) {
    if (event.key !== 'Escape') return
    event.preventDefault()
    close()
  }
  return { open, container, opener, show, close, onKeydown }
}
