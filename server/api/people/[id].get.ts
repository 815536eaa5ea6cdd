import { and, eq } from 'drizzle-orm'
import { idParamSchema } from '#shared/utils/user-schemas'
import { listFitTestsQuerySchema } from '#shared/utils/fit-test-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const { id } = parseParams(event, idParamSchema)
  const person = await findPerson(caller.organizationId, id)
  const today = todayUtc()
  const [tests, oversight, history, linked] = await Promise.all([
    listFitTests(caller.organizationId, listFitTestsQuerySchema.parse({ personId: id, pageSize: 200 })),
    personOversight(caller.organizationId, id, today),
    useDb().select().from(schema.fitHistoryEntries).where(and(eq(schema.fitHistoryEntries.organizationId, caller.organizationId), eq(schema.fitHistoryEntries.personId, id))),
    person.userId ? useDb().select({ id: schema.users.id, email: schema.users.email, displayName: schema.users.displayName, active: schema.users.active }).from(schema.users).where(and(eq(schema.users.organizationId, caller.organizationId), eq(schema.users.id, person.userId))) : []
  ])
  const { standing } = oversight
  const current = standing.respirators.find(r => r.lastPass && r.status !== 'failed')
  return {
    ...person,
    tests: tests.rows,
    importedHistory: history,
    respirators: standing.respirators,
    clearances: oversight.clearances,
    clearance: standing.clearance,
    dueItems: oversight.dueItems,
    reminders: oversight.reminders,
    linkedAccount: linked[0] ?? null,
    nextDueOn: standing.nextDueOn,
    currentRespirator: current?.lastPass ? { make: current.make, model: current.model, size: current.lastPass.size, testedAt: current.lastPass.testedOn } : null,
    status: standing.status
  }
})
