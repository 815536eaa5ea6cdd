import type { DecimalMark } from '#shared/utils/number-reader'

/**
 * The organization's decimal mark, for every field that reads a typed or pasted number. The
 * settings page refreshes the 'number-format' key when an admin changes it.
 */
export function useDecimalMark() {
  const { data } = useFetch('/api/me/number-format', { key: 'number-format' })
  return computed<DecimalMark>(() => data.value?.decimalMark ?? 'point')
}
