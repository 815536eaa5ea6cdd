import type { UserSession } from '#auth-utils'

/**
 * A page render starts knowing who asked and their program's clock zone, read here from the request
 * in one database round trip (the same check every API route makes, `requireRole`), instead of the
 * render asking the session route and the overview over internal requests. A cookie that no longer
 * holds (signed out everywhere, deactivated) is cleared here and the page renders signed out, so it
 * sends the person to sign in rather than drawing a page whose every read will be refused.
 * app/plugins/00.page-start.server.ts hands it to the app. A signed-in page drawn for this same
 * request while the database held what it holds now is sent as it was (server/utils/page-memo.ts).
 */
export default defineEventHandler(async (event) => {
  if (event.path.startsWith('/api/') || event.path.startsWith('/_') || (event.method !== 'GET' && event.method !== 'HEAD')) return
  const start: PageStart = { session: null, programTimeZone: null }
  event.context.pageStart = start
  const { name } = useRuntimeConfig(event).session as { name: string }
  if (!getCookie(event, name)) return

  const { secure: _secure, ...session } = await readUserSession(event)
  if (!session.user) return
  try {
    const caller = await requireRole(event)
    start.session = session as UserSession
    start.programTimeZone = (await listSites(caller.organizationId))[0]?.timeZone ?? null
    const kept = sendKeptPage(event, event.context.dataSnapshot as string)
    if (kept !== false) return kept
  } catch (error) {
    if ((error as { statusCode?: number }).statusCode !== 401) throw error
  }
})
