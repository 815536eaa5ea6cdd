import type { SettingsChange } from '#shared/utils/settings-schemas'

/** Mutations of the program settings page; a change of decimal mark also refreshes how numbers are read. */
export function useSettingsActions() {
  return {
    async update(change: SettingsChange) {
      const saved = await $fetch('/api/settings', { method: 'PATCH', body: change })
      await Promise.all([refreshNuxtData('settings'), refreshNuxtData('number-format')])
      return saved
    },
    async updateOversight(change: { reminders: unknown, clearanceAtStart: string }) {
      const saved = await $fetch('/api/settings/oversight', { method: 'PATCH', body: change as Record<string, unknown> })
      await refreshNuxtData('settings-oversight')
      return saved
    }
  }
}
