import type { Ref } from 'vue'

/** A copy of `source` that follows it once it has been still for `ms` milliseconds. */
export function useDebounced<T>(source: Ref<T>, ms: number): Ref<T> {
  const value = ref(source.value) as Ref<T>
  let timer: ReturnType<typeof setTimeout> | undefined
  watch(source, (next) => {
    clearTimeout(timer)
    timer = setTimeout(() => {
      value.value = next
    }, ms)
  })
  onScopeDispose(() => clearTimeout(timer))
  return value
}
