import { and, asc, desc, eq } from 'drizzle-orm'
import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-practice')
  const { id } = parseParams(event, idParamSchema)
  const set = await findPracticeSet(caller.organizationId, id)
  const db = useDb()
  const p = schema.practicePeople
  const t = schema.practiceTests
  const people = await db.select({ id: p.id, fullName: p.fullName }).from(p).where(and(eq(p.organizationId, caller.organizationId), eq(p.practiceSetId, id))).orderBy(asc(p.fullName))
  const tests = await db.select({
    id: t.id, practicePersonId: t.practicePersonId, status: t.status, protocolKey: t.protocolKey, respiratorClass: t.respiratorClass,
    passLevel: t.passLevel, overallFitFactor: t.overallFitFactor, overallIsLowerBound: t.overallIsLowerBound, passed: t.passed, createdAt: t.createdAt,
    traineeName: schema.users.displayName
  }).from(t).innerJoin(schema.users, eq(schema.users.id, t.traineeUserId))
    .where(and(eq(t.organizationId, caller.organizationId), eq(t.practiceSetId, id))).orderBy(desc(t.createdAt))
  return { ...practiceSetView(set), people, tests, practice: true as const }
})
