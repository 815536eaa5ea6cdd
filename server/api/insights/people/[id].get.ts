import { and, asc, eq, gt } from 'drizzle-orm'
import { assessDrift } from '#shared/utils/compute'
import { DRIFT_DROP_FRACTION } from '#shared/utils/insight-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

const YEAR_MS = 365.25 * 86400 * 1000

/** One person's overall fit factors over time, per respirator model, with the drift assessment. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'see-insights')
  const { id } = parseParams(event, idParamSchema)
  const p = schema.people
  const [person] = await useDb().select({ id: p.id, fullName: p.fullName }).from(p).where(and(eq(p.organizationId, caller.organizationId), eq(p.id, id)))
  if (!person) throw httpError(404, 'No such person in your organization.')
  const t = schema.fitTests
  const tests = await useDb().select({
    id: t.id, performedAt: t.performedAt, respiratorModelId: t.respiratorModelId, respiratorMake: t.respiratorMake, respiratorModel: t.respiratorModel,
    respiratorSize: t.respiratorSize, overallFitFactor: t.overallFitFactor, overallIsLowerBound: t.overallIsLowerBound, passed: t.passed, passLevel: t.passLevel, dueOn: t.dueOn
  }).from(t).where(and(eq(t.organizationId, caller.organizationId), eq(t.personId, id), eq(t.status, 'finished'), gt(t.overallFitFactor, 0))).orderBy(asc(t.performedAt))
  const byModel = new Map<string, typeof tests>()
  for (const row of tests) byModel.set(row.respiratorModelId, [...(byModel.get(row.respiratorModelId) ?? []), row])
  const models = [...byModel.values()].map((rows) => {
    const latest = rows[rows.length - 1]!
    const due = latest.dueOn ? new Date(`${latest.dueOn}T00:00:00Z`) : latest.performedAt
    const drift = assessDrift({
      tests: rows.map(r => ({ t: r.performedAt.getTime() / YEAR_MS, fitFactor: r.overallFitFactor! })),
      passLevel: latest.passLevel ?? 100,
      nextDueT: due.getTime() / YEAR_MS,
      dropFraction: DRIFT_DROP_FRACTION
    })
    return { respiratorModelId: latest.respiratorModelId, make: latest.respiratorMake, model: latest.respiratorModel, passLevel: latest.passLevel, nextDueOn: latest.dueOn, tests: rows, drift }
  })
  return { person, models }
})
