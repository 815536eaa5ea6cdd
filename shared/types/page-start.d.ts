import type { UserSession } from '#auth-utils'

declare global {
  /**
   * What a server render starts with, read from the request by server/middleware/page-start.ts:
   * the session as nuxt-auth-utils' session route would answer it, without its server-only
   * `secure` part (null when signed out or when the cookie no longer holds), and the program's
   * clock zone (its first site's).
   */
  interface PageStart {
    session: UserSession | null
    programTimeZone: string | null
  }
}

export {}
