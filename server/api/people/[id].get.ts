import { idParamSchema } from '#shared/utils/user-schemas'
import { listFitTestsQuerySchema } from '#shared/utils/fit-test-schemas'
import { personFitStatus } from '#shared/utils/person-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'tester', 'reviewer', 'trainer')
  const { id } = parseParams(event, idParamSchema)
  const person = await findPerson(caller.organizationId, id)
  const [tests, passes] = await Promise.all([
    listFitTests(caller.organizationId, listFitTestsQuerySchema.parse({ personId: id, pageSize: 200 })),
    latestPassByPerson(caller.organizationId)
  ])
  const pass = passes.get(id)
  return {
    ...person,
    tests: tests.rows,
    nextDueOn: pass?.dueOn ?? null,
    currentRespirator: pass ? { make: pass.respiratorMake, model: pass.respiratorModel, size: pass.respiratorSize, testedAt: pass.performedAt } : null,
    status: personFitStatus(pass?.dueOn ?? null, todayUtc())
  }
})
