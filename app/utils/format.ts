import { findBuiltInProtocol, findRespiratorClass } from '#shared/utils/compute'

export function formatDate(iso: string | Date | null | undefined, timeZone?: string) {
  if (!iso) return '—'
  const value = typeof iso === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(iso) ? new Date(`${iso}T12:00:00Z`) : new Date(iso)
  return new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: typeof iso === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(iso) ? 'UTC' : timeZone }).format(value)
}

export function formatDateTime(iso: string | Date | null | undefined, timeZone?: string) {
  if (!iso) return '—'
  return new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', timeZone, timeZoneName: timeZone ? 'short' : undefined }).format(new Date(iso))
}

export function protocolName(key: string) {
  if (key === 'qualitative-app-a') return 'Qualitative protocol (29 CFR 1910.134 App. A)'
  return findBuiltInProtocol(key)?.name ?? key
}

export function respiratorClassLabel(key: string) {
  return findRespiratorClass(key)?.label ?? key
}

/** Fit factors as the trade reads them: whole numbers from 100 up, one decimal below; a lower bound as "> n". */
export function formatFactor(value: number | null | undefined, isLowerBound = false) {
  if (value === null || value === undefined) return '—'
  const digits = value >= 100 ? 0 : 1
  const factor = 10 ** digits
  const cut = Math.floor(value * factor) / factor
  return `${isLowerBound ? '> ' : ''}${cut.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits })}`
}
