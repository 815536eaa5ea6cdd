import { and, eq, inArray, isNull, sql } from 'drizzle-orm'
import { localDay } from '#shared/utils/clock'
import { RESPIRATOR_CLASSES } from '#shared/utils/compute'
import { clearanceStanding, coveringClearance, overallStatus, respiratorStandings } from '#shared/utils/oversight'
import type { ClearanceRecord, FitEvent, RespiratorStanding } from '#shared/utils/oversight'
import type { Caller } from './auth'
import type { Decoded } from './json-rows'

const t = schema.fitTests

/** What a fit event needs of a finished test (its site's time zone decides its local date). */
export const finishedTestFacts = {
  id: t.id, personId: t.personId, respiratorModelId: t.respiratorModelId, make: t.respiratorMake, model: t.respiratorModel,
  respiratorClass: t.respiratorClass, size: t.respiratorSize, performedAt: t.performedAt, passed: t.passed, dueOn: t.dueOn, timeZone: schema.sites.timeZone
}
type FinishedTestFact = Decoded<typeof finishedTestFacts>

/** Finished fit tests and imported history of an organization (optionally some people), as fit events per person. */
export async function loadFitEvents(organizationId: string, personIds?: string[]): Promise<Map<string, FitEvent[]>> {
  const h = schema.fitHistoryEntries
  const db = useDb()
  const [tests, history] = await Promise.all([
    db.select(finishedTestFacts).from(t).innerJoin(schema.sites, eq(schema.sites.id, t.siteId))
      .where(and(eq(t.organizationId, organizationId), eq(t.status, 'finished'), personIds ? inArray(t.personId, personIds) : undefined)),
    db.select().from(h).where(and(eq(h.organizationId, organizationId), personIds ? inArray(h.personId, personIds) : undefined))
  ])
  return fitEventsOf(tests, history)
}

/** The finished tests' rows (their site's time zone beside) and imported history, as fit events per person. */
export function fitEventsOf(tests: FinishedTestFact[], history: (typeof schema.fitHistoryEntries.$inferSelect)[]): Map<string, FitEvent[]> {
  const out = new Map<string, FitEvent[]>()
  const push = (personId: string, e: FitEvent) => out.set(personId, [...(out.get(personId) ?? []), e])
  for (const r of tests) {
    if (r.passed === null) continue
    push(r.personId, { respiratorKey: r.respiratorModelId, respiratorModelId: r.respiratorModelId, make: r.make, model: r.model, respiratorClass: r.respiratorClass, size: r.size, testedOn: localDay(r.performedAt, r.timeZone), passed: r.passed, dueOn: r.dueOn, source: 'sealwright', fitTestId: r.id })
  }
  for (const r of history) {
    push(r.personId, { respiratorKey: r.respiratorModelId ?? `${r.respiratorMake} ${r.respiratorModel}`.toLowerCase(), respiratorModelId: r.respiratorModelId, make: r.respiratorMake, model: r.respiratorModel, respiratorClass: r.respiratorClass, size: r.respiratorSize, testedOn: r.testedOn, passed: r.passed === 'pass', dueOn: r.dueOn, source: 'imported', fitTestId: null })
  }
  return out
}

export async function loadAssignments(organizationId: string, personIds?: string[]) {
  const a = schema.respiratorAssignments
  const m = schema.respiratorModels
  const rows = await useDb().select({ personId: a.personId, respiratorModelId: a.respiratorModelId, make: m.make, model: m.model, respiratorClass: m.respiratorClass })
    .from(a).innerJoin(m, eq(m.id, a.respiratorModelId))
    .where(and(eq(a.organizationId, organizationId), personIds ? inArray(a.personId, personIds) : undefined))
  const out = new Map<string, typeof rows>()
  for (const r of rows) out.set(r.personId, [...(out.get(r.personId) ?? []), r])
  return out
}

export async function loadClearances(organizationId: string, personIds?: string[]) {
  const c = schema.medicalClearances
  const rows = await useDb().select().from(c).where(and(eq(c.organizationId, organizationId), personIds ? inArray(c.personId, personIds) : undefined))
  const out = new Map<string, (typeof rows)[number][]>()
  for (const r of rows) out.set(r.personId, [...(out.get(r.personId) ?? []), r])
  return out
}

export interface PersonStanding {
  respirators: RespiratorStanding[]
  status: ReturnType<typeof overallStatus>
  nextDueOn: string | null
  clearance: ReturnType<typeof clearanceStanding>
}

export function standingOf(events: FitEvent[], assigned: Parameters<typeof respiratorStandings>[1], clearances: ClearanceRecord[], today: string): PersonStanding {
  const respirators = respiratorStandings(events, assigned, today)
  const dues = respirators.map(r => r.dueOn).filter((d): d is string => Boolean(d)).sort()
  return { respirators, status: respirators.length ? overallStatus(respirators) : 'never-tested', nextDueOn: dues[0] ?? null, clearance: clearanceStanding(clearances, today) }
}

/** Fit and clearance standing of every person in the organization (or the ones asked for). */
export async function loadStandings(organizationId: string, today: string, personIds?: string[]) {
  const [events, assignments, clearances] = await Promise.all([
    loadFitEvents(organizationId, personIds),
    loadAssignments(organizationId, personIds),
    loadClearances(organizationId, personIds)
  ])
  return (personId: string) => standingOf(events.get(personId) ?? [], assignments.get(personId) ?? [], clearances.get(personId) ?? [], today)
}

export type DueReason = 'overdue' | 'due-soon' | 'never-tested' | 'failed' | 'clearance-lapsed' | 'clearance-lapsing' | 'no-clearance'

export interface DueItem {
  reason: DueReason
  /** 'fit-test:<respirator key>' or 'clearance'. */
  dueItem: string
  dueOn: string | null
  label: string
}

/** What needs action for one person: each respirator not current, and a clearance lapsed or lapsing. */
export function dueItemsOf(standing: PersonStanding): DueItem[] {
  const items: DueItem[] = []
  for (const r of standing.respirators) {
    if (r.status === 'current') continue
    const name = `${r.make} ${r.model}${r.size ? `, size ${r.size}` : ''}`
    items.push({ reason: r.status, dueItem: `fit-test:${r.respiratorKey}`, dueOn: r.dueOn, label: name })
  }
  const c = standing.clearance
  if (c.status === 'lapsed') items.push({ reason: 'clearance-lapsed', dueItem: 'clearance', dueOn: c.validUntil, label: 'Medical clearance' })
  if (c.status === 'lapsing') items.push({ reason: 'clearance-lapsing', dueItem: 'clearance', dueOn: c.validUntil, label: 'Medical clearance' })
  if (c.status === 'none' && standing.respirators.length) items.push({ reason: 'no-clearance', dueItem: 'clearance', dueOn: null, label: 'Medical clearance' })
  return items
}

/**
 * A new wearer account is linked to the roster entry with the same e-mail, when exactly one
 * unlinked entry of the organization has it. Audited like a manual link.
 */
export async function linkWearerByEmail(tx: Tx, caller: Caller, user: { id: string, email: string, role: string }) {
  if (user.role !== 'wearer') return null
  const p = schema.people
  const matches = await tx.select({ id: p.id }).from(p)
    .where(and(eq(p.organizationId, caller.organizationId), sql`lower(${p.email}) = ${user.email.toLowerCase()}`, isNull(p.userId)))
  if (matches.length !== 1) return null
  await tx.update(p).set({ userId: user.id }).where(eq(p.id, matches[0]!.id))
  await writeAudit(tx, caller, { entityType: 'person', entityId: matches[0]!.id, action: 'account-linked', after: { userId: user.id, email: user.email, by: 'matching e-mail' } })
  return matches[0]!.id
}

/**
 * The clearance check at the start of a test: a current record covering the respirator's class
 * on the test day — 29 CFR 1910.134(e)(1). Without one, the program setting decides: flag the
 * result (default), require the tester's reason, or refuse. What was found is kept on the record.
 */
export async function clearanceAtStartFor(organization: { id: string, settings: { clearanceAtStart?: 'flag' | 'require-reason' | 'refuse' } }, personId: string, respiratorClass: string, onDay: string, reason: string | null | undefined) {
  const records = (await loadClearances(organization.id, [personId])).get(personId) ?? []
  const covering = coveringClearance(records, respiratorClass, onDay)
  if (covering) return { onFile: true, clearanceId: covering.id, validUntil: covering.validUntil, reason: null }
  const policy = organization.settings.clearanceAtStart ?? 'flag'
  const label = RESPIRATOR_CLASSES.find(c => c.key === respiratorClass)?.label.toLowerCase() ?? respiratorClass
  if (policy === 'refuse') {
    throw httpError(409, `No current medical clearance covers a ${label} for this person. Record the clearance first — 29 CFR 1910.134(e)(1).`, { fieldErrors: { clearanceReason: 'No current medical clearance for this respirator class.' } })
  }
  if (policy === 'require-reason' && !reason?.trim()) {
    throw httpError(400, `No current medical clearance covers a ${label} for this person. Say why the test goes ahead, or record the clearance first.`, { fieldErrors: { clearanceReason: 'Say why the test goes ahead without a current clearance.' } })
  }
  return { onFile: false, clearanceId: null, validUntil: null, reason: reason?.trim() || null }
}
