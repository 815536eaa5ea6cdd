import { and, desc, eq, sql } from 'drizzle-orm'
import { objectOf, objectsFromJson, rowsFromJson, rowsOf } from './json-rows'
import type { listFitTests } from './fit-test-list'

type ListRow = Awaited<ReturnType<typeof listFitTests>>['rows'][number]

const t = schema.fitTests
const DAY = sql.raw('interval \'2 days\'')
/** The person page lists at most this many of their records (newest first). */
const LISTED = 200

/**
 * Everything the person page shows, in one round trip: the roster entry, their records (as the
 * fit-test list shows them, with what coverage needs), imported history, clearances, wearer
 * reminders, assigned respirators, the finished tests their standing is worked out from, and the
 * linked account. "Missing" and "not yours" are the same 404.
 */
export async function loadPersonRecord(organizationId: string, personId: string, today: string) {
  const [found] = await personStatement().execute({ organizationId, personId })
  if (!found) throw httpError(404, 'No such person in your roster.')

  const [person] = rowsFromJson(p, [found.person])
  const tests = objectsFromJson(listColumns, found.tests) as Omit<ListRow, 'coverage'>[]
  const history = rowsFromJson(h, found.history)
  const events = fitEventsOf(objectsFromJson(finishedTestFacts, found.finished), history)
  const assignments = objectsFromJson(assigned, found.assignments)
  const clearances = rowsFromJson(c, found.clearances)
  const standing = standingOf(events.get(personId) ?? [], assignments, clearances, today)
  const coverage = coverageOfMany(tests, await listSites(organizationId), found.counters as { id: string, calibrationDueOn: string | null }[], found.checks as Parameters<typeof coverageOfMany>[3])
  const [linked] = found.linked ? objectsFromJson({ id: u.id, email: u.email, displayName: u.displayName, active: u.active }, [found.linked]) : []
  return {
    person: person!,
    tests: tests.map((row): ListRow => ({ ...row, coverage: coverage.get(row.id) ?? null })),
    history,
    standing,
    dueItems: dueItemsOf(standing),
    clearances,
    reminders: rowsFromJson(r, found.reminders).map(x => ({ id: x.id, dueItem: x.dueItem, dueOn: x.dueOn, step: x.step, recipient: x.recipient, kind: x.kind, trigger: x.trigger, sentAt: x.sentAt, error: x.error, createdAt: x.createdAt })),
    linked: linked ?? null
  }
}

const p = schema.people
const h = schema.fitHistoryEntries
const c = schema.medicalClearances
const r = schema.reminderLog
const a = schema.respiratorAssignments
const m = schema.respiratorModels
const u = schema.users
const k = schema.counters
const rc = schema.readinessChecks
const assigned = { personId: a.personId, respiratorModelId: a.respiratorModelId, make: m.make, model: m.model, respiratorClass: m.respiratorClass }

/** The statement behind `loadPersonRecord`, prepared once (see preparedRead). */
const personStatement = preparedRead((db) => {
  const organizationId = sql.placeholder('organizationId')
  const personId = sql.placeholder('personId')
  const own = (table: typeof h | typeof c | typeof r | typeof a) => and(eq(table.organizationId, organizationId), eq(table.personId, personId))
  const listed = db.select({ o: sql`${objectOf(listColumns)}`.as('o'), at: sql`${t.performedAt}`.as('at') }).from(t)
    .innerJoin(p, eq(p.id, t.personId))
    .innerJoin(schema.sites, eq(schema.sites.id, t.siteId))
    .innerJoin(u, eq(u.id, t.testerUserId))
    .leftJoin(k, eq(k.id, t.counterId))
    .where(and(listConditions('', {}, undefined, asPlaceholder), eq(t.personId, personId)))
    .orderBy(desc(t.performedAt)).limit(LISTED)
  const finished = db.select({ o: sql`${objectOf(finishedTestFacts)}`.as('o') }).from(t)
    .innerJoin(schema.sites, eq(schema.sites.id, t.siteId))
    .where(and(eq(t.organizationId, organizationId), eq(t.personId, personId), eq(t.status, 'finished')))
  return db.select({
    person: sql`to_jsonb(${p})`,
    tests: sql`(select coalesce(json_agg(q.o order by q.at desc), '[]'::json) from (${listed}) q)`,
    finished: sql`(select coalesce(json_agg(q.o), '[]'::json) from (${finished}) q)`,
    history: rowsOf(h, own(h)),
    clearances: rowsOf(c, own(c), sql`${c.clearedOn} desc`),
    reminders: sql`(select coalesce(json_agg(to_jsonb(x.*) order by x.created_at desc), '[]'::json)
      from (select * from ${r} where ${and(own(r), eq(r.kind, 'wearer'))} order by ${r.createdAt} desc limit 100) x)`,
    assignments: sql`(select coalesce(json_agg(${objectOf(assigned)}), '[]'::json) from ${a} inner join ${m} on ${eq(m.id, a.respiratorModelId)} where ${own(a)})`,
    linked: sql`(select ${objectOf({ id: u.id, email: u.email, displayName: u.displayName, active: u.active })} from ${u}
      where ${u.organizationId} = ${organizationId} and ${u.id} = ${p.userId})`,
    counters: sql`(select coalesce(json_agg(json_build_object('id', ${k.id}, 'calibrationDueOn', ${k.calibrationDueOn})), '[]'::json) from ${k} where ${k.organizationId} = ${organizationId})`,
    // The readiness checks within two days of any of the person's measured tests (coverage).
    checks: sql`(select coalesce(json_agg(json_build_object('id', ${rc.id}, 'counterId', ${rc.counterId}, 'benchRigId', ${rc.benchRigId}, 'status', ${rc.status}, 'completedAt', ${rc.completedAt})), '[]'::json)
      from ${rc} where ${rc.organizationId} = ${organizationId} and exists (select 1 from ${t} f where f.organization_id = ${organizationId}
        and f.person_id = ${personId} and f.counter_id is not null and ${rc.completedAt} between f.performed_at - ${DAY} and f.performed_at + ${DAY}))`
  }).from(p).where(and(eq(p.organizationId, organizationId), eq(p.id, personId))).prepare('person_record')
})
