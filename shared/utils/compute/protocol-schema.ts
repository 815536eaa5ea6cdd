import { z } from 'zod'
import { AMBIENT_PLANS } from './protocol-data'
import { protocolTimeline, sampledSeconds } from './protocol-timeline'

// Schema for a custom protocol an admin adds. The built-in protocols satisfy it too.

const KEY_PATTERN = /^[a-z0-9][a-z0-9-]*$/

const secondsField = (label: string) =>
  z.number({ error: `${label} must be a number of seconds` })
    .nonnegative({ error: `${label} cannot be negative` })

export const samplingPlanSchema = z.object({
  ambientSeconds: secondsField('Ambient seconds'),
  purgeSeconds: secondsField('Purge seconds'),
  maskSeconds: secondsField('In-mask seconds'),
  closingAmbientSeconds: secondsField('Closing ambient seconds').default(0)
})

export const protocolExerciseSchema = z.object({
  key: z.string({ error: 'Exercise key is required' })
    .regex(KEY_PATTERN, { error: 'Exercise key may use lowercase letters, digits and hyphens, starting with a letter or digit' }),
  name: z.string({ error: 'Exercise name is required' }).trim()
    .min(1, { error: 'Exercise name is required' })
    .max(80, { error: 'Exercise name must be at most 80 characters' }),
  durationSeconds: z.number({ error: 'Duration must be a whole number of seconds' })
    .int({ error: 'Duration must be a whole number of seconds' })
    .positive({ error: 'Duration must be at least 1 second' }),
  counted: z.boolean({ error: 'Say whether the exercise counts towards the overall fit factor' }),
  sampling: samplingPlanSchema
}).superRefine((e, ctx) => {
  const needed = sampledSeconds(e.sampling)
  if (needed > e.durationSeconds) {
    ctx.addIssue({
      code: 'custom',
      path: ['sampling'],
      message: `Sampling for '${e.name}' needs ${needed} s (purges included) but the exercise lasts ${e.durationSeconds} s`
    })
  }
  if (e.counted && !(e.sampling.maskSeconds > 0)) {
    ctx.addIssue({ code: 'custom', path: ['sampling', 'maskSeconds'], message: `'${e.name}' is counted, so it needs in-mask seconds` })
  }
})

const exerciseListSchema = z.array(protocolExerciseSchema, { error: 'A protocol needs a list of exercises' })
  .min(1, { error: 'A protocol needs at least one exercise' })
  .superRefine((exercises, ctx) => {
    const keys = new Set<string>()
    const names = new Set<string>()
    exercises.forEach((e, i) => {
      if (keys.has(e.key)) {
        ctx.addIssue({ code: 'custom', path: [i, 'key'], message: `Exercise key '${e.key}' is used twice; keys must be unique` })
      }
      keys.add(e.key)
      const folded = e.name.toLowerCase()
      if (names.has(folded)) {
        ctx.addIssue({ code: 'custom', path: [i, 'name'], message: `Exercise name '${e.name}' is used twice; names must be unique` })
      }
      names.add(folded)
    })
    if (!exercises.some(e => e.counted)) {
      ctx.addIssue({ code: 'custom', path: [], message: 'At least one exercise must count towards the overall fit factor' })
    }
  })

export const protocolSchema = z.object({
  key: z.string({ error: 'Protocol key is required' })
    .regex(KEY_PATTERN, { error: 'Protocol key may use lowercase letters, digits and hyphens, starting with a letter or digit' }),
  name: z.string({ error: 'Protocol name is required' }).trim()
    .min(1, { error: 'Protocol name is required' })
    .max(120, { error: 'Protocol name must be at most 120 characters' }),
  source: z.string().trim().max(300, { error: 'Source must be at most 300 characters' }).default(''),
  ambientPlan: z.enum(AMBIENT_PLANS, { error: 'Choose how ambient is sampled: per exercise, whole test or continuous' }),
  exercises: exerciseListSchema
}).superRefine((protocol, ctx) => {
  // Whether each counted exercise has its ambient samples depends on the whole timeline.
  if (protocol.ambientPlan === 'continuous') return
  const timeline = protocolTimeline(protocol)
  const wholeTest = protocol.ambientPlan === 'whole-test'
  let reportedStart = false
  let reportedEnd = false
  timeline.exercises.forEach((w, i) => {
    if (!w.counted || !w.mask) return
    if (!w.ambientBefore && !(wholeTest && reportedStart)) {
      reportedStart = true
      ctx.addIssue({
        code: 'custom',
        path: ['exercises', i, 'sampling', 'ambientSeconds'],
        message: protocol.ambientPlan === 'per-exercise'
          ? `'${w.exerciseName}' has no ambient sample before its in-mask sample; give it ambient seconds`
          : 'The test needs an ambient sample at the start; give the first exercise ambient seconds'
      })
    }
    if (!w.ambientAfter && !(wholeTest && reportedEnd)) {
      reportedEnd = true
      ctx.addIssue({
        code: 'custom',
        path: ['exercises', i, 'sampling', 'closingAmbientSeconds'],
        message: protocol.ambientPlan === 'per-exercise'
          ? `'${w.exerciseName}' has no ambient sample after its in-mask sample; give a later exercise ambient seconds or this one closing ambient seconds`
          : 'The test needs an ambient sample at the end; give the last exercise closing ambient seconds'
      })
    }
  })
})

export type ProtocolInput = z.input<typeof protocolSchema>
