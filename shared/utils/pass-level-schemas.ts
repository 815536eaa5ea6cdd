import { z } from 'zod'

const level = z.number({ error: 'Type the pass level as a number, or leave it blank for the rule set\'s level.' })
  .int({ error: 'A pass level is a whole number.' })
  .positive({ error: 'A pass level is above zero.' })
  .max(100_000, { error: 'A pass level above 100 000 cannot be shown by any counter; check the number.' })

/**
 * An organization's own pass levels, sent whole: a level left out falls back to the rule set's.
 * The route then refuses any level below the rule set (validatePassLevelOverrides).
 */
export const passLevelOverridesSchema = z.strictObject({
  byFitCategory: z.strictObject({ half: level.optional(), full: level.optional() }, { error: 'Send the levels for half and full facepieces only.' }).default({}),
  byRespiratorClass: z.record(z.string().max(80), level, { error: 'Send the levels per respirator class as class → number.' })
    .refine(v => Object.keys(v).length <= 40, { error: 'Send at most 40 respirator classes.' })
    .default({})
}, { error: 'Send the pass levels as byFitCategory and byRespiratorClass.' })
export type PassLevelOverridesInput = z.input<typeof passLevelOverridesSchema>
