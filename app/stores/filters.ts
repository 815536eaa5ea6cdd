import { defineStore } from 'pinia'
import type { PersonFitStatus } from '#shared/utils/status-labels'

/** List filters that survive moving between pages, so "back to the roster" keeps the view. */
export const useFilterStore = defineStore('filters', {
  state: () => ({
    people: { q: '', siteId: '', status: '' as PersonFitStatus | '', sort: 'fullName' as 'fullName' | 'employeeNumber' | 'nextDueOn', dir: 'asc' as 'asc' | 'desc', page: 1 },
    fitTests: { q: '', siteId: '', result: '' as '' | 'pass' | 'fail' | 'draft' | 'withdrawn', from: '', to: '', page: 1 }
  })
})

/** Drops empty strings so a query string only carries the filters actually set. */
export function compactQuery<T extends Record<string, unknown>>(values: T): Partial<T> {
  return Object.fromEntries(Object.entries(values).filter(([, v]) => v !== '' && v !== null && v !== undefined)) as Partial<T>
}
