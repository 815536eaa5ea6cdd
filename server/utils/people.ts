import { and, asc, eq, inArray } from 'drizzle-orm'
import type { z } from 'zod'
import type { listPeopleQuerySchema } from '#shared/utils/person-schemas'

export async function findPerson(organizationId: string, id: string): Promise<PersonRow> {
  const [row] = await useDb().select().from(schema.people).where(and(eq(schema.people.organizationId, organizationId), eq(schema.people.id, id)))
  if (!row) throw httpError(404, 'No such person in your roster.')
  return row
}

/** The roster's person ids by employee number, for the rows of an import that name people that way. */
export async function personIdsByEmployeeNumber(organizationId: string, numbers: string[]): Promise<Map<string | null, string>> {
  if (!numbers.length) return new Map()
  const p = schema.people
  const rows = await useDb().select({ id: p.id, employeeNumber: p.employeeNumber }).from(p)
    .where(and(eq(p.organizationId, organizationId), inArray(p.employeeNumber, numbers)))
  return new Map(rows.map(x => [x.employeeNumber, x.id]))
}

export function todayUtc() {
  return new Date().toISOString().slice(0, 10)
}

/**
 * The program's today, for due dates and standing: the latest calendar day among UTC and the
 * program's sites' zones. A due date passes as soon as it has passed at any of its sites, so a
 * site east of UTC never sees a lapsed fit test or clearance shown as still current.
 */
export async function programToday(organizationId: string) {
  return latestDay(new Date(), (await listSites(organizationId)).map(site => site.timeZone))
}

/** The roster with each person's fit status, filtered, sorted and paged in memory (rosters are thousands, not millions). */
export async function listPeople(organizationId: string, q: z.output<typeof listPeopleQuerySchema>) {
  const today = await programToday(organizationId)
  const [rows, standingFor, sites] = await Promise.all([
    useDb().select().from(schema.people).where(eq(schema.people.organizationId, organizationId)).orderBy(asc(schema.people.fullName)),
    loadStandings(organizationId, today),
    listSites(organizationId)
  ])
  const siteNames = new Map(sites.map(s => [s.id, s.name]))
  const needle = q.q?.toLowerCase()
  let list = rows.map((p) => {
    const standing = standingFor(p.id)
    const fitted = standing.respirators.filter(r => r.lastPass)
    return {
      id: p.id, fullName: p.fullName, employeeNumber: p.employeeNumber, jobTitle: p.jobTitle, siteId: p.siteId,
      siteName: p.siteId ? siteNames.get(p.siteId) ?? null : null, active: p.active,
      medicalClearanceStatus: p.medicalClearanceStatus,
      clearance: standing.clearance.status,
      nextDueOn: standing.nextDueOn,
      // Every respirator with a pass, each with its size: a person may wear several.
      currentRespirator: fitted.length ? fitted.map(r => `${r.make} ${r.model}, ${r.lastPass!.size}`).join('; ') : null,
      status: standing.status
    }
  })
  if (needle) list = list.filter(p => p.fullName.toLowerCase().includes(needle) || (p.employeeNumber ?? '').toLowerCase().includes(needle) || (p.jobTitle ?? '').toLowerCase().includes(needle))
  if (q.siteId) list = list.filter(p => p.siteId === q.siteId)
  if (q.status) list = list.filter(p => p.status === q.status)
  const key = q.sort
  const sign = q.dir === 'desc' ? -1 : 1
  list.sort((a, b) => sign * String(a[key] ?? '\uffff').localeCompare(String(b[key] ?? '\uffff')))
  const total = list.length
  return { rows: list.slice((q.page - 1) * q.pageSize, q.page * q.pageSize), total, page: q.page, pageSize: q.pageSize }
}

export async function assertSiteOf(organizationId: string, siteId: string | null | undefined) {
  if (!siteId) return
  const sites = await listSites(organizationId)
  if (!sites.some(s => s.id === siteId)) {
    throw httpError(400, 'Check the form: choose one of your sites.', { fieldErrors: { siteId: 'Choose one of your sites.' } })
  }
}

/** What a route sends for a person it created or changed: the roster fields, never the organization. */
export function personView(row: PersonRow) {
  return {
    id: row.id, fullName: row.fullName, employeeNumber: row.employeeNumber, jobTitle: row.jobTitle, email: row.email,
    siteId: row.siteId, userId: row.userId, medicalClearanceOn: row.medicalClearanceOn, medicalClearanceStatus: row.medicalClearanceStatus,
    notes: row.notes, reminderOptOut: row.reminderOptOut, active: row.active
  }
}

/** What a route sends for a medical clearance: dates, who cleared, classes and restrictions; never who typed it in or its import key. */
export function clearanceView(row: MedicalClearanceRow) {
  return { id: row.id, personId: row.personId, clearedOn: row.clearedOn, validUntil: row.validUntil, clearedBy: row.clearedBy, respiratorClasses: row.respiratorClasses, restrictions: row.restrictions }
}
