import type { Permission } from '#shared/utils/permissions'
import { roleMay } from '#shared/utils/permissions'

/**
 * `const may = useMay()`, then `may('record')` in a template or computed: whether the signed-in
 * role may do that, from the one permission table. It hides what a role cannot use; the server
 * is the gate.
 */
export function useMay() {
  const { user } = useUserSession()
  return (permission: Permission): boolean => roleMay(user.value?.role, permission)
}
