/**
 * Focus that must survive a navigation or a refetch: one component asks ("after Finish, the
 * verdict"), the component that renders the new content claims it once it is on screen.
 */
export function useFocusRequest() {
  const wanted = useState<string | null>('focus-request', () => null)
  return {
    request(target: string) {
      wanted.value = target
    },
    claim(target: string, element: HTMLElement | null | undefined) {
      if (wanted.value !== target || !element) return false
      wanted.value = null
      nextTick(() => element.focus())
      return true
    }
  }
}
