// Program oversight, pure: fit status per person and respirator, medical clearance coverage, what
// is due, and which reminder step a due date has reached. Used by the server (lists, reminders)
// and by pages; imports neither Vue nor Nitro.
import { nextDueDate, retestIntervalMonths } from './fit-test-evaluate'

export const DUE_SOON_DAYS = 30

/** A finished fit test or an imported history entry, reduced to what standing needs. */
export interface FitEvent {
  /** Catalogue model id when known; imported history without a catalogue match uses make+model. */
  respiratorKey: string
  respiratorModelId: string | null
  make: string
  model: string
  respiratorClass: string
  size: string
  /** Calendar date of the test in the site's time zone. */
  testedOn: string
  passed: boolean
  /** Stored due date of a passing test (already follows the program's interval). */
  dueOn: string | null
  source: 'sealwright' | 'imported'
  fitTestId: string | null
}

export type RespiratorStatus = 'current' | 'due-soon' | 'overdue' | 'never-tested' | 'failed'

export interface RespiratorStanding {
  respiratorKey: string
  respiratorModelId: string | null
  make: string
  model: string
  respiratorClass: string
  /** Size of the current pass (or of the latest test when none passed). */
  size: string | null
  status: RespiratorStatus
  dueOn: string | null
  lastPass: FitEvent | null
  /** The latest test of any result: a failure after a pass shows here. */
  latest: FitEvent | null
  assigned: boolean
}

export function addDays(day: string, days: number): string {
  const d = new Date(`${day}T00:00:00Z`)
  d.setUTCDate(d.getUTCDate() + days)
  return d.toISOString().slice(0, 10)
}

export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000)
}

/**
 * Due date of an imported passing test: the same rule as a recorded one — the same day of the
 * month `months` later, or that month's last day (a 29 February test is due 28 February).
 * 29 CFR 1910.134(f)(2) asks for a test "at least annually": falling back to the month's last
 * day never lets the interval exceed twelve months, where 1 March would.
 */
export function importedDueOn(testedOn: string, passed: boolean, retestMonthsSetting?: number | null): string | null {
  return passed ? nextDueDate(testedOn, retestIntervalMonths(retestMonthsSetting)) : null
}

export function statusOfDueDate(dueOn: string | null, today: string, soonDays = DUE_SOON_DAYS): 'current' | 'due-soon' | 'overdue' | 'never-tested' {
  if (!dueOn) return 'never-tested'
  if (dueOn < today) return 'overdue'
  return dueOn <= addDays(today, soonDays) ? 'due-soon' : 'current'
}

/**
 * One line per respirator a person wears or was tested on. The current pass is the newest passing
 * test of that model; a failure newer than it makes the line 'failed' (never hidden behind the
 * older pass), and its due date is still shown.
 */
export function respiratorStandings(
  events: FitEvent[],
  assigned: { respiratorModelId: string, make: string, model: string, respiratorClass: string }[],
  today: string
): RespiratorStanding[] {
  const byKey = new Map<string, FitEvent[]>()
  for (const e of events) byKey.set(e.respiratorKey, [...(byKey.get(e.respiratorKey) ?? []), e])
  const assignedKeys = new Set(assigned.map(a => a.respiratorModelId))
  const out: RespiratorStanding[] = []
  for (const [key, list] of byKey) {
    const sorted = [...list].sort((a, b) => b.testedOn.localeCompare(a.testedOn) || Number(b.source === 'sealwright') - Number(a.source === 'sealwright'))
    const latest = sorted[0]!
    const lastPass = sorted.find(e => e.passed) ?? null
    const dueOn = lastPass?.dueOn ?? null
    // A failure newer than the last pass means the fit no longer holds, whatever the old due date says.
    const status: RespiratorStatus = latest.passed ? statusOfDueDate(dueOn, today) : 'failed'
    out.push({
      respiratorKey: key, respiratorModelId: latest.respiratorModelId, make: latest.make, model: latest.model,
      respiratorClass: latest.respiratorClass, size: (lastPass ?? latest).size, status, dueOn, lastPass, latest,
      assigned: latest.respiratorModelId ? assignedKeys.has(latest.respiratorModelId) : false
    })
  }
  for (const a of assigned) {
    if (byKey.has(a.respiratorModelId)) continue
    out.push({ respiratorKey: a.respiratorModelId, respiratorModelId: a.respiratorModelId, make: a.make, model: a.model, respiratorClass: a.respiratorClass, size: null, status: 'never-tested', dueOn: null, lastPass: null, latest: null, assigned: true })
  }
  return out.sort((a, b) => `${a.make} ${a.model}`.localeCompare(`${b.make} ${b.model}`))
}

/** A person's overall fit status: the worst of their respirators. */
export function overallStatus(standings: RespiratorStanding[]): RespiratorStatus {
  const order: RespiratorStatus[] = ['overdue', 'failed', 'never-tested', 'due-soon', 'current']
  for (const s of order) if (standings.some(x => x.status === s)) return s
  return 'never-tested'
}

export interface ClearanceRecord {
  id: string
  clearedOn: string
  validUntil: string | null
  clearedBy: string
  respiratorClasses: string[]
  restrictions: string | null
}

/**
 * The clearance that covers a respirator class on a day: recorded on or before it, not yet
 * lapsed (valid through `validUntil` inclusive) and naming the class. The latest-ending one wins.
 */
export function coveringClearance<T extends ClearanceRecord>(records: T[], respiratorClass: string, onDay: string): T | null {
  const candidates = records.filter(r => r.clearedOn <= onDay && (r.validUntil === null || r.validUntil >= onDay) && r.respiratorClasses.includes(respiratorClass))
  candidates.sort((a, b) => (b.validUntil ?? '9999-12-31').localeCompare(a.validUntil ?? '9999-12-31'))
  return candidates[0] ?? null
}

export type ClearanceStatus = 'current' | 'lapsing' | 'lapsed' | 'none'

/** The standing of a person's clearances taken together: the newest-ending record decides. */
export function clearanceStanding(records: ClearanceRecord[], today: string, soonDays = DUE_SOON_DAYS): { status: ClearanceStatus, validUntil: string | null, record: ClearanceRecord | null } {
  const started = records.filter(r => r.clearedOn <= today)
  if (!started.length) return { status: 'none', validUntil: null, record: null }
  const best = [...started].sort((a, b) => (b.validUntil ?? '9999-12-31').localeCompare(a.validUntil ?? '9999-12-31'))[0]!
  if (best.validUntil === null) return { status: 'current', validUntil: null, record: best }
  if (best.validUntil < today) return { status: 'lapsed', validUntil: best.validUntil, record: best }
  return { status: best.validUntil <= addDays(today, soonDays) ? 'lapsing' : 'current', validUntil: best.validUntil, record: best }
}

export interface ReminderSettings {
  enabled: boolean
  /** Days before a due date when the first reminder goes out. */
  leadDays: number
  /** Days between repeated reminders once overdue. */
  repeatDays: number
  /** Roles that receive a digest of their site's due people. */
  digestRoles: ('tester' | 'admin')[]
}

export const DEFAULT_REMINDER_SETTINGS: ReminderSettings = { enabled: true, leadDays: 30, repeatDays: 7, digestRoles: ['tester'] }

export function reminderSettingsOf(stored: Partial<ReminderSettings> | undefined | null): ReminderSettings {
  return { ...DEFAULT_REMINDER_SETTINGS, ...(stored ?? {}) }
}

/**
 * The reminder step a due date has reached today, or null: 'ahead' from `leadDays` before the due
 * date through the due date; after it, 'overdue-1', 'overdue-2', … one per `repeatDays`. A step
 * name is stable for its whole window, so a step is sent once whichever day in the window runs.
 */
export function reminderStep(dueOn: string, today: string, settings: Pick<ReminderSettings, 'leadDays' | 'repeatDays'>): string | null {
  const daysLeft = daysBetween(today, dueOn)
  if (daysLeft >= 0) return daysLeft <= settings.leadDays ? 'ahead' : null
  const overdueDays = -daysLeft
  return `overdue-${Math.floor((overdueDays - 1) / Math.max(1, settings.repeatDays)) + 1}`
}
