import { z } from 'zod'
import { CONCENTRATION_UNITS } from './compute/exposure'
import { LIMIT_KINDS, SUBSTANCE_FORMS } from './compute/exposure-assessment'

// The protection calculator's inputs and saved exposure assessments: one schema for the form and
// the route. Numbers arrive already read from the typed text (see exposure-number.ts).

const MAX_CONCENTRATION = 1e9

const text = (max: number, label: string) => z.string({ error: `${label}: enter text.` })
  .max(max, { error: `${label}: use at most ${max} characters.` })
  .refine(v => !v.includes('\u0000'), { error: `${label}: remove the control characters.` })
  .transform(v => v.trim())

const concentration = (label: string) => z.number({ error: `${label}: enter a number.` })
  .min(0, { error: `${label} cannot be negative.` })
  .max(MAX_CONCENTRATION, { error: `${label}: enter at most ${MAX_CONCENTRATION}.` })

const positive = (label: string, max: number) => z.number({ error: `${label}: enter a number.` })
  .gt(0, { error: `${label} must be more than zero.` })
  .max(max, { error: `${label}: enter at most ${max}.` })

const unitSchema = z.enum(CONCENTRATION_UNITS, { error: 'Choose a unit from the list.' })

const segmentSchema = z.object({
  concentration: concentration('Concentration'),
  hours: positive('Hours', 24)
})

const exposureSchema = z.discriminatedUnion('mode', [
  z.object({ mode: z.literal('single'), value: concentration('Measured exposure').nullable(), unit: unitSchema }),
  z.object({ mode: z.literal('segments'), unit: unitSchema, segments: z.array(segmentSchema).min(1, { error: 'Add at least one segment.' }).max(24, { error: 'Use at most 24 segments.' }) })
], { error: 'Choose one concentration or time segments.' })

export const contaminantSchema = z.object({
  name: text(120, 'Substance').pipe(z.string().min(1, { error: 'Name the substance.' })),
  form: z.enum(SUBSTANCE_FORMS, { error: 'Choose gas or vapour, dust, mist or fume, or fibres.' }),
  molecularWeight: positive('Molecular weight', 5000).nullable().optional(),
  exposure: exposureSchema,
  limit: z.object({
    value: positive('Exposure limit', MAX_CONCENTRATION).nullable(),
    unit: unitSchema,
    kind: z.enum(LIMIT_KINDS, { error: 'Choose the kind of limit.' }),
    source: text(300, 'Source of the limit')
  }),
  idlh: positive('IDLH', MAX_CONCENTRATION).nullable().optional()
})

export const assessmentInputSchema = z.object({
  contaminants: z.array(contaminantSchema).min(1, { error: 'Add at least one substance.' }).max(12, { error: 'Use at most 12 substances.' }),
  additiveMixture: z.boolean({ error: 'Say whether the substances add.' }),
  oxygenDeficient: z.boolean({ error: 'Say whether the air may be oxygen-deficient.' })
})
export type AssessmentFormInput = z.input<typeof assessmentInputSchema>
export type AssessmentStoredInput = z.output<typeof assessmentInputSchema>

const classKeys = z.array(z.string().max(80).regex(/^[a-z0-9-]+$/, { error: 'Choose classes from the list.' }))
  .max(12, { error: 'Choose at most 12 classes.' })

export const saveAssessmentSchema = z.object({
  title: text(160, 'Job or work area').pipe(z.string().min(1, { error: 'Name the job or work area.' })),
  siteId: z.uuid({ error: 'Choose a site from the list.' }).nullable().optional(),
  input: assessmentInputSchema,
  chosenClassKeys: classKeys.default([]),
  rationale: text(4000, 'Rationale').default('')
})
export type SaveAssessmentInput = z.input<typeof saveAssessmentSchema>

export const updateAssessmentSchema = saveAssessmentSchema.extend({
  version: z.number({ error: 'Reload the assessment.' }).int().min(1).max(1e6)
})

export const reviseAssessmentSchema = z.object({
  reason: text(1000, 'Reason').pipe(z.string().min(3, { error: 'Say why the assessment is being revised.' }))
})

export const assignmentSchema = z.object({
  personId: z.uuid({ error: 'Choose a person from the list.' }).nullable().optional(),
  jobTitle: text(120, 'Job title').nullable().optional()
}).refine(v => Boolean(v.personId) !== Boolean(v.jobTitle), { error: 'Choose either one person or one job title.', path: ['personId'] })

export const assessmentIdSchema = z.object({ id: z.uuid() })
export const assignmentIdSchema = z.object({ id: z.uuid(), assignmentId: z.uuid() })

export const assessmentListQuerySchema = z.object({
  personId: z.uuid({ error: 'Choose a person from the list.' }).optional()
})

export const ASSESSMENT_STATUS_LABELS = {
  'draft': 'Draft',
  'signed-off': 'Signed off',
  'superseded': 'Replaced by a later revision'
} as const
export type AssessmentStatus = keyof typeof ASSESSMENT_STATUS_LABELS
