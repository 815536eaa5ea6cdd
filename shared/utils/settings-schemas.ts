import { z } from 'zod'
import { DECIMAL_MARKS } from './number-reader'
import type { DecimalMark } from './number-reader'

export const UNCOVERED_RESULT_CHOICES = ['flag', 'refuse'] as const

/**
 * A partial update of the program settings: only the fields sent change, so saving the decimal
 * mark never resets the choice about uncovered results, and the other way round.
 */
export const settingsSchema = z.strictObject({
  uncoveredResults: z.enum(UNCOVERED_RESULT_CHOICES, { error: 'Choose flag or refuse.' }).optional(),
  decimalMark: z.enum(DECIMAL_MARKS as [DecimalMark, ...DecimalMark[]], { error: 'Choose a point or a comma as the decimal mark.' }).optional()
}, {
  error: issue => issue.code === 'unrecognized_keys'
    ? `Only the decimal mark and the choice about uncovered results are changed here, not ${issue.keys.join(', ')}.`
    : 'Send the settings to change as an object.'
})
export type SettingsChange = z.input<typeof settingsSchema>

export const DECIMAL_MARK_LABELS: Readonly<Record<DecimalMark, { label: string, example: string }>> = {
  point: { label: 'Point', example: '12.5 — a comma only groups thousands: 12,500' },
  comma: { label: 'Comma', example: '12,5 — a point only groups thousands: 12.500' }
}

/** What every signed-in person's browser needs to read the numbers they type. */
export interface NumberFormat {
  decimalMark: DecimalMark
}
