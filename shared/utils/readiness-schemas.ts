import { z } from 'zod'
import { acceptanceRuleSchema } from './compute'
import { databaseInteger } from './input-ranges'
import type { AcceptanceRule } from './compute'

/** Parts a mask type may have; a step or sub-check that needs a part is skipped for a mask without it. */
export const MASK_PARTS = ['drinkTube', 'exhalationValve'] as const
export type MaskPart = typeof MASK_PARTS[number]
export const MASK_PART_LABELS: Record<MaskPart, string> = {
  drinkTube: 'a drink tube',
  exhalationValve: 'an exhalation valve'
}

/** What a readiness template is for: the counter on its own, or a bench rig with its paired counter. */
export const TEMPLATE_SCOPES = ['counter', 'bench-rig'] as const
export type TemplateScope = typeof TEMPLATE_SCOPES[number]
export const TEMPLATE_SCOPE_LABELS: Record<TemplateScope, string> = {
  'counter': 'Counter on its own',
  'bench-rig': 'Bench rig with its counter'
}

export interface ReadinessStep {
  name: string
  instruction: string
  rule: AcceptanceRule
  requiresPart: MaskPart | null
}

const name = (what: string) => z.string({ error: `Enter ${what}.` }).trim()
  .min(1, { error: `Enter ${what}.` })
  .max(120, { error: 'Use at most 120 characters.' })

export const readinessStepSchema = z.object({
  name: name('a step name'),
  instruction: z.string({ error: 'Enter what the tester does in this step.' }).trim()
    .min(1, { error: 'Enter what the tester does in this step.' })
    .max(600, { error: 'Use at most 600 characters.' }),
  rule: acceptanceRuleSchema,
  requiresPart: z.enum(MASK_PARTS, { error: 'Choose a mask part, or none.' }).nullable().default(null)
})

export const readinessTemplateSchema = z.object({
  name: name('a template name'),
  scope: z.enum(TEMPLATE_SCOPES, { error: 'Choose whether the template is for a counter or a bench rig.' }),
  steps: z.array(readinessStepSchema, { error: 'Add at least one step.' })
    .min(1, { error: 'Add at least one step.' })
    .max(40, { error: 'Use at most 40 steps.' })
}).superRefine((template, ctx) => {
  const seen = new Map<string, number>()
  template.steps.forEach((step, index) => {
    const key = step.name.toLowerCase()
    const first = seen.get(key)
    if (first !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['steps', index, 'name'], message: `Step ${index + 1} has the same name as step ${first + 1}; give each step its own name.` })
    } else {
      seen.set(key, index)
    }
  })
  if (template.scope === 'counter') {
    template.steps.forEach((step, index) => {
      if (step.requiresPart) ctx.addIssue({ code: 'custom', path: ['steps', index, 'requiresPart'], message: 'A counter template has no mask on the bench; only a bench-rig step can depend on a mask part.' })
    })
  }
})
export type ReadinessTemplateInput = z.input<typeof readinessTemplateSchema>
export type ReadinessTemplate = z.output<typeof readinessTemplateSchema>

export const updateReadinessTemplateSchema = z.object({
  name: name('a template name').optional(),
  steps: readinessTemplateSchema.shape.steps.optional(),
  active: z.boolean({ error: 'Active must be true or false.' }).optional()
})

export const startReadinessCheckSchema = z.object({
  templateId: z.uuid({ error: 'Choose a template.' }),
  counterId: z.uuid({ error: 'Choose a counter.' }).optional(),
  benchRigId: z.uuid({ error: 'Choose a bench rig.' }).optional(),
  maskTypeId: z.uuid({ error: 'Choose the mask type on the headform.' }).optional()
}).refine(v => v.counterId || v.benchRigId, { error: 'Choose a counter or a bench rig.', path: ['counterId'] })
export type StartReadinessCheck = z.infer<typeof startReadinessCheckSchema>

export const recordStepSchema = z.object({
  stepIndex: databaseInteger('Say which step this is.').min(0),
  value: z.union([z.number({ error: 'Enter a number.' }).min(-1e12, { error: 'That reading is beyond any instrument\'s range.' }).max(1e12, { error: 'That reading is beyond any instrument\'s range.' }), z.boolean()], { error: 'Enter a number, or mark pass or fail.' }),
  note: z.string().trim().max(600, { error: 'Use at most 600 characters.' }).optional()
})
export type RecordStep = z.infer<typeof recordStepSchema>

export const abandonCheckSchema = z.object({
  reason: z.string({ error: 'Say why the check is abandoned.' }).trim()
    .min(3, { error: 'Say why the check is abandoned (a few words).' })
    .max(600, { error: 'Use at most 600 characters.' })
})

export const listChecksQuerySchema = z.object({
  counterId: z.uuid().optional(),
  benchRigId: z.uuid().optional(),
  status: z.enum(['in-progress', 'passed', 'failed', 'abandoned']).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50)
})

export const CHECK_STATUSES = ['in-progress', 'passed', 'failed', 'abandoned'] as const
export type CheckStatus = typeof CHECK_STATUSES[number]
export const CHECK_STATUS_LABELS: Record<CheckStatus, string> = {
  'in-progress': 'In progress',
  'passed': 'Passed',
  'failed': 'Failed',
  'abandoned': 'Abandoned'
}

/** One recorded attempt at a step; a retried step keeps every attempt. */
export interface StepEntry {
  stepIndex: number
  value: number | boolean
  passed: boolean
  message: string
  note?: string
  recordedAt: string
  recordedBy: string
}
