import { and, asc, desc, eq, inArray, ne } from 'drizzle-orm'
import type { z } from 'zod'
import { selectionClassesFor } from '#shared/utils/compute'
import type { PassLevelRuleSetKey, SelectionClass } from '#shared/utils/compute'
import { evaluateExposureAssessment } from '#shared/utils/compute/exposure-assessment'
import type { AssessmentResult } from '#shared/utils/compute/exposure-assessment'
import type { saveAssessmentSchema } from '#shared/utils/exposure-schemas'
import { protectionFor } from '#shared/utils/exposure-protection'
import type { PersonProtection } from '#shared/utils/exposure-protection'
import { respiratorStandings } from '#shared/utils/oversight'

export type AssessmentRow = typeof schema.exposureAssessments.$inferSelect
export type SaveAssessment = z.output<typeof saveAssessmentSchema>

export function assessmentError(statusCode: number, message: string, fieldErrors?: Record<string, string>) {
  return httpError(statusCode, message, fieldErrors ? { fieldErrors } : undefined)
}

// Named apart from pass-levels.ts's `ruleSetOf(org)`: server utils share one auto-import namespace.
export async function assessmentRuleSetOf(organizationId: string): Promise<PassLevelRuleSetKey> {
  const [org] = await useDb().select({ ruleSet: schema.organizations.ruleSet }).from(schema.organizations).where(eq(schema.organizations.id, organizationId))
  return org?.ruleSet === 'uk-hse' ? 'uk-hse' : 'us-osha'
}

export async function findAssessment(organizationId: string, id: string): Promise<AssessmentRow> {
  const a = schema.exposureAssessments
  const [row] = await useDb().select().from(a).where(and(eq(a.organizationId, organizationId), eq(a.id, id)))
  if (!row) throw assessmentError(404, 'No such exposure assessment in your organization.')
  return row
}

/**
 * The server's own result, from the stored inputs only, and the chosen classes checked against
 * it: a class whose APF is below the required protection factor cannot be chosen.
 */
export function evaluateForSave(input: SaveAssessment, ruleSet: PassLevelRuleSetKey): AssessmentResult {
  const result = evaluateExposureAssessment({ ruleSet, ...input.input })
  if (!result.ok) {
    const fieldErrors: Record<string, string> = {}
    for (const issue of result.issues.filter(i => i.severity === 'error')) fieldErrors[`input.${issue.field ?? '_'}`] ??= issue.message
    throw assessmentError(400, `Check the calculator: ${Object.values(fieldErrors)[0] ?? 'a value is missing'}`, fieldErrors)
  }
  for (const key of input.chosenClassKeys) {
    const cls = result.value.classes.find(c => c.selectionClass.key === key)
    if (!cls) throw assessmentError(400, 'Choose respirator classes from the list.', { chosenClassKeys: 'Choose respirator classes from the list.' })
    if (!cls.adequate) {
      const message = `${cls.selectionClass.label} is not adequate here: its protection factor (${cls.selectionClass.apf}) is below what the job needs, or the atmosphere is IDLH.`
      throw assessmentError(400, message, { chosenClassKeys: message })
    }
  }
  return result.value
}

export async function assertAssessmentSite(organizationId: string, siteId: string | null | undefined) {
  if (!siteId) return
  const s = schema.sites
  const [site] = await useDb().select({ id: s.id }).from(s).where(and(eq(s.organizationId, organizationId), eq(s.id, siteId)))
  if (!site) throw assessmentError(400, 'Choose one of your sites.', { siteId: 'Choose one of your sites.' })
}

/** Every revision that is not superseded: the signed-off one and any draft revision after it. */
export async function listAssessments(organizationId: string) {
  const a = schema.exposureAssessments
  return useDb().select({
    id: a.id, recordId: a.recordId, revision: a.revision, status: a.status, title: a.title, siteId: a.siteId,
    requiredProtectionFactor: a.requiredProtectionFactor, idlhAtmosphere: a.idlhAtmosphere,
    chosenClassKeys: a.chosenClassKeys, signedOffAt: a.signedOffAt, updatedAt: a.updatedAt
  }).from(a)
    .where(and(eq(a.organizationId, organizationId), ne(a.status, 'superseded')))
    .orderBy(asc(a.title), desc(a.revision))
}

export async function revisionsOf(organizationId: string, recordId: string) {
  const a = schema.exposureAssessments
  return useDb().select({
    id: a.id, revision: a.revision, status: a.status, revisionReason: a.revisionReason, signedOffAt: a.signedOffAt, createdAt: a.createdAt
  }).from(a).where(and(eq(a.organizationId, organizationId), eq(a.recordId, recordId))).orderBy(asc(a.revision))
}

export async function userNames(ids: (string | null)[]) {
  const wanted = [...new Set(ids.filter((x): x is string => Boolean(x)))]
  if (!wanted.length) return new Map<string, string>()
  const rows = await useDb().select({ id: schema.users.id, displayName: schema.users.displayName }).from(schema.users).where(inArray(schema.users.id, wanted))
  return new Map(rows.map(r => [r.id, r.displayName]))
}

/** Classes a fit test must match: the chosen ones, or every adequate one while none is chosen. */
export function allowedClassesOf(row: Pick<AssessmentRow, 'ruleSet' | 'input' | 'chosenClassKeys'>): SelectionClass[] {
  const ruleSet = row.ruleSet === 'uk-hse' ? 'uk-hse' : 'us-osha'
  const result = evaluateExposureAssessment({ ruleSet, ...row.input })
  if (!result.ok) return []
  const adequate = result.value.classes.filter(c => c.adequate).map(c => c.selectionClass)
  if (row.chosenClassKeys.length === 0) return adequate
  return selectionClassesFor(ruleSet).filter(c => row.chosenClassKeys.includes(c.key) && adequate.some(a => a.key === c.key))
}

export interface AssignedPerson {
  personId: string
  fullName: string
  jobTitle: string | null
  via: string
  protection: PersonProtection
}

/** The record's assignments, and the people they reach (a job title reaches every active person with it). */
export async function assignmentsOf(organizationId: string, recordId: string) {
  const x = schema.exposureAssignments
  return useDb().select({ id: x.id, personId: x.personId, jobTitle: x.jobTitle, fullName: schema.people.fullName })
    .from(x).leftJoin(schema.people, eq(schema.people.id, x.personId))
    .where(and(eq(x.organizationId, organizationId), eq(x.recordId, recordId))).orderBy(asc(x.createdAt))
}

/** The finished fit tests behind the conditions relied on, for the coverage flag. */
async function fitTestsForCoverage(organizationId: string, ids: string[]) {
  const t = schema.fitTests
  if (!ids.length) return []
  return useDb().select({ id: t.id, performedAt: t.performedAt, counterId: t.counterId, siteId: t.siteId })
    .from(t).where(and(eq(t.organizationId, organizationId), inArray(t.id, ids)))
}

export async function protectedPeopleOf(organizationId: string, rows: Pick<AssessmentRow, 'recordId' | 'ruleSet' | 'input' | 'chosenClassKeys'>[], today: string) {
  const x = schema.exposureAssignments
  const recordIds = rows.map(r => r.recordId)
  if (!recordIds.length) return new Map<string, AssignedPerson[]>()
  const [assignments, roster] = await Promise.all([
    useDb().select().from(x).where(and(eq(x.organizationId, organizationId), inArray(x.recordId, recordIds))),
    useDb().select({ id: schema.people.id, fullName: schema.people.fullName, jobTitle: schema.people.jobTitle, active: schema.people.active })
      .from(schema.people).where(eq(schema.people.organizationId, organizationId)).orderBy(asc(schema.people.fullName))
  ])
  const reached = new Map<string, Map<string, { person: typeof roster[number], via: string }>>()
  for (const a of assignments) {
    const people = reached.get(a.recordId) ?? new Map()
    for (const p of roster) {
      if (!p.active) continue
      if (a.personId === p.id) people.set(p.id, { person: p, via: 'assigned by name' })
      else if (a.jobTitle && p.jobTitle && a.jobTitle.toLowerCase() === p.jobTitle.trim().toLowerCase() && !people.has(p.id)) {
        people.set(p.id, { person: p, via: `job title: ${a.jobTitle}` })
      }
    }
    reached.set(a.recordId, people)
  }
  const allIds = [...new Set([...reached.values()].flatMap(m => [...m.keys()]))]
  // Fit standing per respirator model by the oversight rules (a later failure on the same model
  // cancels an earlier pass), and each person's clearance records.
  const [events, clearances] = allIds.length ? await Promise.all([loadFitEvents(organizationId, allIds), loadClearances(organizationId, allIds)]) : [new Map(), new Map()]
  const standings = new Map(allIds.map(id => [id, respiratorStandings(events.get(id) ?? [], [], today)]))
  const out = new Map<string, AssignedPerson[]>()
  for (const row of rows) {
    const allowedClasses = allowedClassesOf(row)
    const people = [...(reached.get(row.recordId)?.values() ?? [])]
    out.set(row.recordId, people.map(({ person, via }) => ({
      personId: person.id, fullName: person.fullName, jobTitle: person.jobTitle, via,
      protection: protectionFor({ allowedClasses, respirators: standings.get(person.id) ?? [], clearances: clearances.get(person.id) ?? [], today })
    })))
  }
  // A fit test no passing readiness check covers is flagged wherever it is relied on.
  const reliedOn = (c: PersonProtection['conditions'][number]) => c.key === 'fit-test' && c.met && c.recordId ? c.recordId : null
  const relied = [...new Set([...out.values()].flat().flatMap(p => p.protection.conditions.map(reliedOn)).filter((id): id is string => Boolean(id)))]
  const coverage = await findCoverageMany(organizationId, await fitTestsForCoverage(organizationId, relied))
  for (const p of [...out.values()].flat()) {
    for (const c of p.protection.conditions) {
      const id = reliedOn(c)
      const cover = id ? coverage.get(id) : undefined
      if (cover && !cover.covered) p.protection.notes.push(`Flag: the fit test relied on here is not covered. ${cover.message}`)
    }
  }
  return out
}

/** The assessment each record is judged by: its signed-off revision, else its latest draft. */
export async function effectiveAssessments(organizationId: string) {
  const a = schema.exposureAssessments
  const rows = await useDb().select().from(a).where(and(eq(a.organizationId, organizationId), ne(a.status, 'superseded'))).orderBy(asc(a.title), desc(a.revision))
  const byRecord = new Map<string, AssessmentRow>()
  for (const r of rows) {
    const held = byRecord.get(r.recordId)
    if (!held || (held.status !== 'signed-off' && r.status === 'signed-off')) byRecord.set(r.recordId, r)
  }
  return [...byRecord.values()]
}

export interface ProtectionGap {
  assessmentId: string
  assessmentTitle: string
  signedOff: boolean
  personId: string
  fullName: string
  jobTitle: string | null
  gap: string
}

/** Every assigned person who is not protected, across the organization's assessments. */
export async function protectionGaps(organizationId: string, today: string, personId?: string): Promise<ProtectionGap[]> {
  const rows = await effectiveAssessments(organizationId)
  const people = await protectedPeopleOf(organizationId, rows, today)
  const gaps: ProtectionGap[] = []
  for (const row of rows) {
    for (const p of people.get(row.recordId) ?? []) {
      if (p.protection.protected || (personId && p.personId !== personId)) continue
      gaps.push({ assessmentId: row.id, assessmentTitle: row.title, signedOff: row.status === 'signed-off', personId: p.personId, fullName: p.fullName, jobTitle: p.jobTitle, gap: p.protection.gap ?? '' })
    }
  }
  return gaps
}

/** What a route sends for one assessment revision: its own fields, never the organization or user ids (the names go beside it). */
export function assessmentView(row: ExposureAssessmentRow) {
  return {
    id: row.id, recordId: row.recordId, revision: row.revision, revisionReason: row.revisionReason, status: row.status, version: row.version,
    title: row.title, siteId: row.siteId, ruleSet: row.ruleSet, input: row.input, chosenClassKeys: row.chosenClassKeys, rationale: row.rationale,
    requiredProtectionFactor: row.requiredProtectionFactor, idlhAtmosphere: row.idlhAtmosphere, signedOffAt: row.signedOffAt
  }
}
