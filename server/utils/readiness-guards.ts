// Readiness checks: the rules a check follows — which counter, rig and steps it covers, the row
// lock before a change, one verdict per step. The reads are in readiness-queries.ts.
import { and, eq } from 'drizzle-orm'
import { evaluateAcceptanceRule } from '#shared/utils/compute'
import type { RecordStep, ReadinessStep, StartReadinessCheck, StepEntry } from '#shared/utils/readiness-schemas'

/** Steps the mask type on the headform lacks the part for. */
export function skippedStepsFor(steps: ReadinessStep[], maskType: { hasDrinkTube: boolean, hasExhalationValve: boolean } | null) {
  if (!maskType) return []
  return steps.flatMap((s, i) => (s.requiresPart === 'drinkTube' && !maskType.hasDrinkTube) || (s.requiresPart === 'exhalationValve' && !maskType.hasExhalationValve) ? [i] : [])
}

export function nextStep(from: number, total: number, skipped: number[]): number {
  let i = from
  while (i < total && skipped.includes(i)) i++
  return i
}

/** Works out counter, rig, site and skipped steps for a new check; refuses mismatched choices. */
export async function planCheck(organizationId: string, input: StartReadinessCheck) {
  const template = await findTemplate(organizationId, input.templateId)
  if (!template.active) throw httpError(409, 'This template is retired; choose an active one.')
  const bad = (field: string, message: string) => httpError(400, `Check the form: ${message}`, { fieldErrors: { [field]: message } })
  let rig = null
  let counterId = input.counterId
  if (template.scope === 'bench-rig') {
    if (!input.benchRigId) throw bad('benchRigId', 'Choose the bench rig this template checks.')
    rig = await findBenchRig(organizationId, input.benchRigId)
    if (!rig.active) throw httpError(409, 'This bench rig is retired.')
    counterId = rig.counterId
  } else if (input.benchRigId) {
    throw bad('templateId', 'This template is for a counter on its own; choose a bench-rig template for a rig.')
  }
  if (!counterId) throw bad('counterId', 'Choose the counter to check.')
  const counter = await findCounter(organizationId, counterId)
  if (!counter.active) throw httpError(409, 'This counter is retired.')
  const maskType = input.maskTypeId && rig ? await findMaskType(organizationId, input.maskTypeId) : null
  return {
    template, counter, rig, maskType,
    siteId: rig?.siteId ?? counter.siteId,
    skippedSteps: skippedStepsFor(template.steps, maskType)
  }
}

/** Locks an open check for a change; an ended one is a 409, since a finished record is never edited. */
export async function lockOpenCheck(tx: Tx, organizationId: string, id: string) {
  const c = schema.readinessChecks
  const [row] = await tx.select().from(c).where(and(eq(c.organizationId, organizationId), eq(c.id, id))).for('update')
  if (!row) throw httpError(404, 'No such readiness check in your organization.')
  if (row.status !== 'in-progress') {
    throw httpError(409, `This readiness check has ended (${row.status}) and can no longer be changed. Start a new check instead.`)
  }
  return row
}

type OpenCheck = Awaited<ReturnType<typeof lockOpenCheck>>

/** One attempt at the current step: the verdict at once, the check moves on when it passes. */
export function applyStep(check: OpenCheck, input: RecordStep, userId: string, now = new Date()) {
  if (input.stepIndex !== check.currentStep) {
    throw httpError(409, `This check is at step ${check.currentStep + 1}, not step ${input.stepIndex + 1}. Reload the page to see where it is.`)
  }
  const step = check.steps[check.currentStep]!
  const verdict = evaluateAcceptanceRule(step.rule, input.value, step.name)
  if (!verdict.ok) {
    const message = verdict.issues[0]?.message ?? 'Enter the value for this step.'
    throw httpError(400, `Check the form: ${message}`, { fieldErrors: { value: message } })
  }
  const entry: StepEntry = { stepIndex: input.stepIndex, value: input.value, passed: verdict.value.passed, message: verdict.value.message, recordedAt: now.toISOString(), recordedBy: userId, ...(input.note ? { note: input.note } : {}) }
  const currentStep = verdict.value.passed ? nextStep(check.currentStep + 1, check.steps.length, check.skippedSteps) : check.currentStep
  const finished = currentStep >= check.steps.length
  return {
    entry,
    changes: {
      entries: [...check.entries, entry],
      currentStep,
      ...(finished ? { status: 'passed' as const, completedAt: now } : {})
    }
  }
}
