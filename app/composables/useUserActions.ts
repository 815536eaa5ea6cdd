import type { CreateUser, UpdateUser } from '#shared/utils/user-schemas'

/** Mutations of the users page; each refreshes the list it changed. */
export function useUserActions(listKey: string) {
  const refresh = () => refreshNuxtData(listKey)
  return {
    async create(input: CreateUser) {
      const user = await $fetch('/api/users', { method: 'POST', body: input })
      await refresh()
      return user
    },
    async update(id: string, changes: UpdateUser) {
      const user = await $fetch(`/api/users/${id}`, { method: 'PATCH', body: changes })
      await refresh()
      return user
    },
    async resendInvitation(id: string) {
      return $fetch(`/api/users/${id}/invitation`, { method: 'POST' })
    }
  }
}
