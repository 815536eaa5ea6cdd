/**
 * A server render takes the session and the program's clock zone from its own request
 * (server/middleware/page-start.ts). nuxt-auth-utils' own loader is off (`auth.loadStrategy`
 * 'none' in nuxt.config.ts); signing in and out still reload the session through its route.
 * A render the middleware did not see (none is expected) asks the session route as before.
 */
export default defineNuxtPlugin({
  name: 'sealwright:page-start',
  enforce: 'pre',
  async setup() {
    const { session, fetch } = useUserSession()
    const start = useRequestEvent()?.context.pageStart as PageStart | undefined
    if (!start) {
      await fetch()
      return
    }
    session.value = start.session
    useState('nuxt-auth-ready', () => false).value = true
    if (start.session?.user) {
      useState<string | null>(PROGRAM_TIME_ZONE_KEY, () => null).value = start.programTimeZone
      useState<string | null>(PROGRAM_TIME_ZONE_FOR_KEY, () => null).value = start.session.user.id
    }
  }
})
