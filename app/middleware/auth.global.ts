import { roleAllows } from '#shared/utils/roles'
import type { Role } from '#shared/utils/roles'

declare module '#app' {
  interface PageMeta {
    /** Pages anyone may open without signing in. */
    public?: boolean
    /** Roles that may open the page (admins always may). The server still checks every request. */
    roles?: Role[]
  }
}

export default defineNuxtRouteMiddleware(async (to) => {
  if (to.meta.public) return
  const { loggedIn, user } = useUserSession()
  if (!loggedIn.value) {
    return navigateTo({ path: '/sign-in', query: to.fullPath !== '/' ? { next: to.fullPath } : {} })
  }
  const roles = to.meta.roles
  if (roles && user.value && !roleAllows(user.value.role, roles)) {
    return abortNavigation(createError({ statusCode: 403, message: 'Your role does not open this page.' }))
  }
})
