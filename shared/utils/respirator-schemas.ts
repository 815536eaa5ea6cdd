import { z } from 'zod'
import { RESPIRATOR_CLASSES } from './compute'
import { partialWithoutDefaults } from './patch-schema'

const classKeys = RESPIRATOR_CLASSES.map(c => c.key) as [string, ...string[]]

export const respiratorModelSchema = z.object({
  make: z.string({ error: 'Enter the make.' }).trim().min(1, { error: 'Enter the make.' }).max(80),
  model: z.string({ error: 'Enter the model.' }).trim().min(1, { error: 'Enter the model.' }).max(80),
  respiratorClass: z.enum(classKeys, { error: 'Choose the style from the list.' }),
  sizes: z.array(z.string().trim().min(1).max(40)).min(1, { error: 'List at least one size (for example S, M, L or "one size").' }).max(12)
    .refine(list => new Set(list.map(s => s.toLowerCase())).size === list.length, { error: 'Each size may appear only once.' }),
  notes: z.string().trim().max(1000).transform(v => v === '' ? null : v).nullable().optional()
})
export type RespiratorModelInput = z.input<typeof respiratorModelSchema>

export const updateRespiratorModelSchema = partialWithoutDefaults(respiratorModelSchema).extend({ active: z.boolean().optional() })
