import { INSIGHT_FILTER_KEYS, readInsightFilters } from '#shared/utils/insight-schemas'
import type { InsightFilters } from '#shared/utils/insight-schemas'

/**
 * Insights filters live in the URL so a view can be bookmarked and shared. A field that cannot be
 * read is dropped from the URL and named in `resetMessage`, never silently reinterpreted.
 */
export function useInsightFilters() {
  const route = useRoute()
  const router = useRouter()
  const resetMessage = useState<string | null>('insight-filter-reset', () => null)

  const parsed = computed(() => readInsightFilters(route.query as Record<string, unknown>))
  const filters = computed<InsightFilters>(() => parsed.value.filters)

  watch(() => parsed.value.dropped, (dropped) => {
    if (dropped.length === 0) return
    resetMessage.value = `Some filters in the address could not be read and were reset: ${dropped.map(d => d.message).join(' ')}`
    const droppedFields = new Set(dropped.map(d => d.field))
    router.replace({ query: Object.fromEntries(Object.entries(route.query).filter(([k]) => !droppedFields.has(k))) })
  }, { immediate: true })

  /** The query string the API gets: only the set fields. */
  const apiQuery = computed(() => {
    const q: Record<string, string> = {}
    for (const key of INSIGHT_FILTER_KEYS) {
      const v = filters.value[key]
      if (v !== undefined && v !== null && v !== '') q[key] = String(v)
    }
    return q
  })

  function setFilter(key: typeof INSIGHT_FILTER_KEYS[number], value: string) {
    resetMessage.value = null
    const query = { ...route.query, [key]: value || undefined }
    if (key === 'respiratorModelId') delete query.respiratorSize
    router.replace({ query })
  }

  function clearFilters() {
    resetMessage.value = null
    router.replace({ query: {} })
  }

  return { filters, apiQuery, setFilter, clearFilters, resetMessage }
}
