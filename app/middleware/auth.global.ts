import type { Permission } from '#shared/utils/permissions'
import { roleMay } from '#shared/utils/permissions'

declare module '#app' {
  interface PageMeta {
    /** Pages anyone may open without signing in. */
    public?: boolean
    /**
     * What a role must be allowed to do to open the page (shared/utils/permissions.ts; admins
     * always may). Comfort only: the server checks every request with the same table.
     */
    may?: Permission
  }
}

export default defineNuxtRouteMiddleware(async (to) => {
  if (to.meta.public) return
  const { loggedIn, user } = useUserSession()
  if (!loggedIn.value) {
    return navigateTo({ path: '/sign-in', query: to.fullPath !== '/' ? { next: to.fullPath } : {} })
  }
  const permission = to.meta.may
  if (permission && user.value && !roleMay(user.value.role, permission)) {
    return abortNavigation(createError({ statusCode: 403, message: 'Your role does not open this page.' }))
  }
})
