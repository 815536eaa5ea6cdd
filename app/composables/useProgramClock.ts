/**
 * Sets the zone every page uses for an event that carries no site of its own: the program's first
 * site. The overview read is shared (same key) with the pages that already ask for it.
 */
export async function useProgramClock() {
  const zone = useState<string | null>(PROGRAM_TIME_ZONE_KEY, () => null)
  const { data } = await useFetch('/api/overview', { key: 'overview' })
  watchEffect(() => {
    zone.value = data.value?.sites[0]?.timeZone ?? null
  })
  return zone
}
