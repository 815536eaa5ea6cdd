import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const { id } = parseParams(event, idParamSchema)
  // One query for the person and everything their page shows (the caller's sites came with the caller).
  const found = await loadPersonRecord(caller.organizationId, id, await programToday(caller.organizationId))
  const { standing } = found
  const current = standing.respirators.find(r => r.lastPass && r.status !== 'failed')
  return {
    ...personView(found.person),
    tests: found.tests,
    importedHistory: found.history.map(h => ({ id: h.id, testedOn: h.testedOn, respiratorModelId: h.respiratorModelId, respiratorMake: h.respiratorMake, respiratorModel: h.respiratorModel, respiratorClass: h.respiratorClass, respiratorSize: h.respiratorSize, passed: h.passed, overallFitFactor: h.overallFitFactor, testerName: h.testerName, dueOn: h.dueOn })),
    respirators: standing.respirators,
    clearances: found.clearances.map(clearanceView),
    clearance: standing.clearance,
    dueItems: found.dueItems,
    reminders: found.reminders,
    linkedAccount: found.linked,
    nextDueOn: standing.nextDueOn,
    currentRespirator: current?.lastPass ? { make: current.make, model: current.model, size: current.lastPass.size, testedAt: current.lastPass.testedOn } : null,
    status: standing.status
  }
})
