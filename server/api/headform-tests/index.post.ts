import { headformTestSchema } from '#shared/utils/mask-schemas'

/** Stores the raw inputs of a headform test; the factor and verdict are recomputed, never taken from the client. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const input = await parseBody(event, headformTestSchema)
  const plan = await planHeadformTest(caller.organizationId, input)
  const performedAt = new Date()
  const coverage = await findCoverage(caller.organizationId, { counterId: plan.counter.id, benchRigId: plan.rig.id, siteId: plan.siteId, performedAt })
  const organization = await findOrganization(caller.organizationId)
  if (!coverage.covered && organization.settings.uncoveredResults === 'refuse') {
    throw httpError(409, `Not saved: ${coverage.message} Your program refuses results no readiness check covers.`, { coverage })
  }
  const id = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(schema.headformTests).values({
      ...plan.raw,
      organizationId: caller.organizationId,
      maskUnitId: plan.unit.id,
      benchRigId: plan.rig.id,
      counterId: plan.counter.id,
      siteId: plan.siteId,
      performedAt,
      performedBy: caller.id,
      passLevelIsDefault: plan.level.isDefault,
      passed: plan.result.passed === true,
      notes: input.notes
    }).returning({ id: schema.headformTests.id })
    await writeAudit(tx, caller, { entityType: 'headform-test', entityId: row!.id, action: 'recorded', after: { ...plan.raw, maskUnitId: plan.unit.id, benchRigId: plan.rig.id, passed: plan.result.passed, covered: coverage.covered } })
    return row!.id
  })
  setResponseStatus(event, 201)
  const [test] = (await listHeadformTests(caller.organizationId, { maskUnitId: plan.unit.id, limit: 1 }))
  return { ...test!, id, unitState: plan.unit.state, passLevelLabel: plan.level.label }
})
