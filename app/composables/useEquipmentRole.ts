import { roleMay } from '#shared/utils/permissions'

/** Who manages equipment, from the permission table; reviewers and trainers only read. The server checks again. */
export function useEquipmentRole() {
  const { user } = useUserSession()
  return {
    canManage: computed(() => roleMay(user.value?.role, 'record')),
    isAdmin: computed(() => roleMay(user.value?.role, 'administer'))
  }
}
