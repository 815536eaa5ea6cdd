import { z } from 'zod'
import { BUILT_IN_PROTOCOLS, RESPIRATOR_CLASSES } from './compute'
import { fitTestEntrySchema } from './fit-test-schemas'

// Names typed by a trainer: printable text only (PostgreSQL refuses NUL in text).
const name = (what: string) => z.string({ error: `Enter ${what}.` }).trim()
  .min(1, { error: `Enter ${what}.` })
  .max(80, { error: `Keep ${what} under 80 characters.` })
  // eslint-disable-next-line no-control-regex
  .refine(v => !/[\u0000-\u001f\u007f]/.test(v), { error: 'Use letters, digits and punctuation only.' })

export const FIT_TESTED_CLASSES = RESPIRATOR_CLASSES.filter(c => c.fitCategory !== null)
const classKeys = FIT_TESTED_CLASSES.map(c => c.key) as [string, ...string[]]
const protocolKeys = BUILT_IN_PROTOCOLS.map(p => p.key) as [string, ...string[]]

export const createPracticeSetSchema = z.object({ name: name('a name for the practice set') })

export const createPracticePersonSchema = z.object({
  practiceSetId: z.uuid({ error: 'Choose a practice set.' }),
  fullName: name('an invented name')
})

export const createPracticeTestSchema = z.object({
  idempotencyKey: z.string().regex(/^[\w-]{8,100}$/, { error: 'The idempotency key must be 8–100 letters, digits or dashes.' }),
  practicePersonId: z.uuid({ error: 'Choose a practice person.' }),
  respiratorClass: z.enum(classKeys, { error: 'Choose a tight-fitting respirator class.' }),
  protocolKey: z.enum(protocolKeys, { error: 'Choose a protocol.' }),
  sampleFlowCm3PerMin: z.number({ error: 'Enter the counter\'s sample flow in cm³/min.' })
    .positive({ error: 'The sample flow must be above 0 cm³/min.' })
    .max(10_000, { error: 'The sample flow must be at most 10,000 cm³/min.' })
})
export type CreatePracticeTest = z.input<typeof createPracticeTestSchema>

export const updatePracticeTestSchema = z.object({
  version: z.number({ error: 'The draft version is missing; reload the page.' }).int().positive().max(1_000_000),
  entry: fitTestEntrySchema.optional(),
  seriesText: z.string().max(2_000_000, { error: 'The series is larger than 2 MB.' })
    .refine(v => !v.includes('\u0000'), { error: 'The series contains a NUL character; paste it as plain text.' })
    .nullable().optional()
})

export const finishPracticeTestSchema = z.object({
  version: z.number({ error: 'The draft version is missing; reload the page.' }).int().positive().max(1_000_000)
})
