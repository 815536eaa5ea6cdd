import { z } from 'zod'
import type { AcceptanceRule } from './compute'
import { changesSchema } from './input-ranges'
import type { MaskPart } from './readiness-schemas'

export const MASK_UNIT_STATES = ['in-service', 'held', 'retired'] as const
export type MaskUnitState = typeof MASK_UNIT_STATES[number]
export const MASK_UNIT_STATE_LABELS: Record<MaskUnitState, string> = {
  'in-service': 'In service',
  'held': 'Held',
  'retired': 'Retired'
}

const text = (what: string, max = 120) => z.string({ error: `Enter ${what}.` }).trim()
  .min(1, { error: `Enter ${what}.` })
  .max(max, { error: `Use at most ${max} characters.` })

export const maskTypeSchema = z.object({
  name: text('a name for the mask type'),
  hasDrinkTube: z.boolean().default(false),
  hasExhalationValve: z.boolean().default(false),
  headformPassLevel: z.number({ error: 'Enter the pass level as a number, or leave it empty for the default.' })
    .positive({ error: 'The pass level must be above 0.' })
    .max(1_000_000, { error: 'A pass level above 1,000,000 cannot be shown on the bench.' })
    .nullable().default(null),
  headformRetestDays: z.number({ error: 'Enter the days between headform tests.' })
    .int({ error: 'Use a whole number of days.' })
    .min(1, { error: 'Use at least 1 day.' })
    .max(3650, { error: 'Use at most 3,650 days (ten years).' })
})
export type MaskTypeInput = z.input<typeof maskTypeSchema>
export const updateMaskTypeSchema = changesSchema(maskTypeSchema)

export const maskUnitSchema = z.object({
  serialNumber: text('the serial number', 60),
  respiratorModelId: z.uuid({ error: 'Choose the model from the catalogue.' }),
  maskTypeId: z.uuid({ error: 'Choose the mask type.' }),
  size: text('the size', 20),
  siteId: z.uuid({ error: 'Choose a site.' }).nullable().default(null)
})
export type MaskUnitInput = z.input<typeof maskUnitSchema>
export const updateMaskUnitSchema = changesSchema(maskUnitSchema)

export const changeMaskStateSchema = z.object({
  state: z.enum(MASK_UNIT_STATES, { error: 'Choose in service, held or retired.' }),
  reason: text('the reason for the change', 600),
  /** A program admin returning a held unit to service without a passing headform test since the hold. */
  override: z.boolean({ error: 'Override must be true or false.' }).optional()
})
export type ChangeMaskState = z.infer<typeof changeMaskStateSchema>

export const listMaskUnitsQuerySchema = z.object({
  state: z.enum(MASK_UNIT_STATES).optional(),
  maskTypeId: z.uuid().optional()
})

/** Sub-checks of a headform test besides the bench protection factor. Defaults of our own; confirm them locally. */
export interface HeadformSubCheckDefinition {
  key: string
  label: string
  rule: AcceptanceRule
  requiresPart: MaskPart | null
}

export const HEADFORM_SUB_CHECKS: readonly HeadformSubCheckDefinition[] = [
  { key: 'harness-and-buckles', label: 'Head harness and buckles intact', rule: { kind: 'pass-fail' }, requiresPart: null },
  { key: 'lens-and-seal-face', label: 'Lens and sealing face free of cracks and set', rule: { kind: 'pass-fail' }, requiresPart: null },
  { key: 'valve-cover-seat', label: 'Exhalation valve seats and closes', rule: { kind: 'pass-fail' }, requiresPart: 'exhalationValve' },
  { key: 'drink-tube-cap', label: 'Drink tube cap closes and holds', rule: { kind: 'pass-fail' }, requiresPart: 'drinkTube' }
]

export function subChecksFor(type: { hasDrinkTube: boolean, hasExhalationValve: boolean }): HeadformSubCheckDefinition[] {
  return HEADFORM_SUB_CHECKS.filter(c => c.requiresPart === null
    || (c.requiresPart === 'drinkTube' && type.hasDrinkTube)
    || (c.requiresPart === 'exhalationValve' && type.hasExhalationValve))
}

const concentration = (what: string) => z.number({ error: `Enter the ${what} concentration in particles/cm³.` })
  .min(0, { error: `The ${what} concentration cannot be negative.` })
  .max(1e9, { error: `That ${what} concentration is beyond any counter's range; check the decimal point.` })

export const headformTestSchema = z.object({
  maskUnitId: z.uuid({ error: 'Choose the mask unit.' }),
  benchRigId: z.uuid({ error: 'Choose the bench rig.' }),
  outside: concentration('outside').positive({ error: 'The outside concentration must be above 0; is the aerosol generator running?' }),
  inside: concentration('inside'),
  sampleSeconds: z.number({ error: 'Enter the bench sample in seconds.' }).positive({ error: 'The bench sample must last more than 0 seconds.' }).max(3600, { error: 'Use at most 3,600 seconds.' }),
  subChecks: z.record(z.string().max(60), z.boolean({ error: 'Mark each sub-check pass or fail.' }))
    .refine(r => Object.keys(r).length <= 20, { error: 'A mask has at most 20 sub-checks.' }).default({}),
  notes: z.string().trim().max(600, { error: 'Use at most 600 characters.' }).default('')
})
export type HeadformTestForm = z.input<typeof headformTestSchema>
