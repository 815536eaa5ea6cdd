import { roleAllows } from '#shared/utils/roles'

/** Testers and admins manage equipment; reviewers and trainers only read. The server checks again. */
export function useEquipmentRole() {
  const { user } = useUserSession()
  return {
    canManage: computed(() => Boolean(user.value && roleAllows(user.value.role, ['tester']))),
    isAdmin: computed(() => user.value?.role === 'admin')
  }
}
