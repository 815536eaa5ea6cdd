import type { SignIn } from '#shared/utils/user-schemas'

/**
 * Signing in and out, choosing a password from a link and asking for a reset link. Each one that
 * changes the session reloads it, so the navigation and the role checks follow at once.
 */
export function useAuthActions() {
  const session = useUserSession()
  return {
    async signIn(input: SignIn) {
      await $fetch('/api/auth/sign-in', { method: 'POST', body: input })
      await session.fetch()
    },
    /** A session that had already ended is signed out all the same; any other refusal is thrown. */
    async signOut(everywhere = false) {
      try {
        await $fetch(everywhere ? '/api/auth/sign-out-everywhere' : '/api/auth/sign-out', { method: 'POST' })
      } catch (error) {
        if ((error as { statusCode?: number }).statusCode !== 401) throw error
      }
      await session.clear()
    },
    async setPassword(token: string, input: { password: string, confirm: string }) {
      await $fetch(`/api/auth/tokens/${encodeURIComponent(token)}`, { method: 'POST', body: input })
      await session.fetch()
    },
    /** The answer is the same for every address; its sentence says what happens next. */
    async requestPasswordReset(input: { email: string }) {
      const answer = await $fetch('/api/auth/password-reset', { method: 'POST', body: input })
      return answer.message
    }
  }
}
