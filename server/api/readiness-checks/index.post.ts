import { startReadinessCheckSchema } from '#shared/utils/readiness-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const input = await parseBody(event, startReadinessCheckSchema)
  const plan = await planCheck(caller.organizationId, input)
  const id = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(schema.readinessChecks).values({
      organizationId: caller.organizationId,
      templateId: plan.template.id,
      templateName: plan.template.name,
      counterId: plan.counter.id,
      benchRigId: plan.rig?.id ?? null,
      siteId: plan.siteId,
      maskTypeId: plan.maskType?.id ?? null,
      steps: plan.template.steps,
      skippedSteps: plan.skippedSteps,
      currentStep: nextStep(0, plan.template.steps.length, plan.skippedSteps),
      performedBy: caller.id
    }).returning({ id: schema.readinessChecks.id })
    await writeAudit(tx, caller, { entityType: 'readiness-check', entityId: row!.id, action: 'started', after: input })
    return row!.id
  })
  setResponseStatus(event, 201)
  return findCheck(caller.organizationId, id)
})
