import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const { id } = parseParams(event, idParamSchema)
  // One query for the person and everything their page shows (the caller's sites came with the caller).
  const found = await loadPersonRecord(caller.organizationId, id, todayUtc())
  const { standing } = found
  const current = standing.respirators.find(r => r.lastPass && r.status !== 'failed')
  return {
    ...found.person,
    tests: found.tests,
    importedHistory: found.history,
    respirators: standing.respirators,
    clearances: found.clearances,
    clearance: standing.clearance,
    dueItems: found.dueItems,
    reminders: found.reminders,
    linkedAccount: found.linked,
    nextDueOn: standing.nextDueOn,
    currentRespirator: current?.lastPass ? { make: current.make, model: current.model, size: current.lastPass.size, testedAt: current.lastPass.testedOn } : null,
    status: standing.status
  }
})
