import { storeToRefs } from 'pinia'

/**
 * A list page's filters, kept in the filter store across pages: the search box follows typing
 * after a short pause and sends the list back to page 1; `query` is what the list route gets.
 */
export function useListFilters<K extends 'people' | 'fitTests'>(list: K, pageSize = 25) {
  const refs = storeToRefs(useFilterStore())
  const filters = refs[list]
  const search = ref(filters.value.q)
  const debounced = useDebounced(search, 250)
  watch(debounced, (q) => {
    filters.value.q = q
    filters.value.page = 1
  })
  const query = computed(() => compactQuery({ ...filters.value, pageSize }))
  /** Back to the unfiltered list, keeping the sort a person chose. */
  function clear() {
    search.value = ''
    const values = filters.value as Record<string, unknown>
    for (const key of Object.keys(values)) {
      if (key === 'sort' || key === 'dir') continue
      values[key] = key === 'page' ? 1 : ''
    }
  }
  return { filters, search, query, clear }
}
