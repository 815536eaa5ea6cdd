/**
 * The zone every page uses for an event that carries no site of its own: the program's first
 * site. A server render already has it (app/plugins/00.page-start.server.ts); after signing in
 * within the page, or as someone else, it is read once from the overview.
 */
export async function useProgramClock() {
  const zone = useState<string | null>(PROGRAM_TIME_ZONE_KEY, () => null)
  const zoneFor = useState<string | null>(PROGRAM_TIME_ZONE_FOR_KEY, () => null)
  const { user } = useUserSession()
  const userId = user.value?.id
  if (userId && zoneFor.value !== userId) {
    const overview = await useRequestFetch()('/api/overview').catch(() => null)
    zone.value = overview?.sites[0]?.timeZone ?? null
    zoneFor.value = overview ? userId : null
  }
  return zone
}
