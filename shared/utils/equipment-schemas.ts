import { z } from 'zod'
import { calendarDate, changesSchema } from './input-ranges'

const serialNumber = z.string({ error: 'Enter the serial number.' }).trim()
  .min(1, { error: 'Enter the serial number.' })
  .max(60, { error: 'Use at most 60 characters.' })
const description = z.string().trim().max(200, { error: 'Use at most 200 characters.' })
const siteId = z.uuid({ error: 'Choose a site.' }).nullable()

export const counterSchema = z.object({
  serialNumber,
  description: description.default(''),
  sampleFlowCm3PerMin: z.number({ error: 'Enter the sample flow in cm³/min.' })
    .positive({ error: 'The sample flow must be above 0 cm³/min.' })
    .max(10_000, { error: 'A sample flow above 10,000 cm³/min is not plausible; check the unit (cm³/min).' }),
  calibrationDueOn: calendarDate('Enter the calibration due date as a date.').nullable().default(null),
  siteId: siteId.default(null)
})
export type CounterInput = z.input<typeof counterSchema>

export const updateCounterSchema = changesSchema(counterSchema).extend({
  active: z.boolean({ error: 'Active must be true or false.' }).optional()
})

export const benchRigSchema = z.object({
  serialNumber,
  description: description.default(''),
  counterId: z.uuid({ error: 'Choose the counter paired with this rig.' }),
  siteId: siteId.default(null)
})
export type BenchRigInput = z.input<typeof benchRigSchema>

export const updateBenchRigSchema = changesSchema(benchRigSchema).extend({
  active: z.boolean({ error: 'Active must be true or false.' }).optional()
})

export const listEquipmentQuerySchema = z.object({
  includeRetired: z.enum(['true', 'false']).optional()
})
