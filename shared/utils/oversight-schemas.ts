import { z } from 'zod'
import { RESPIRATOR_CLASSES } from './compute/respirator-classes'
import { DUE_REASONS } from './status-labels'

const classKeys = RESPIRATOR_CLASSES.map(c => c.key) as [string, ...string[]]
// NUL and other control characters are refused in every free-text field.
const plainText = (max: number, label: string) => z.string({ error: `${label}: enter text.` }).trim()
  .max(max, { error: `${label}: use at most ${max} characters.` })
  .refine(v => ![...v].some(ch => ch.charCodeAt(0) < 32 && ch !== '\n' && ch !== '\r' && ch !== '\t'), { error: `${label}: remove the control characters.` })
const isoDay = (label: string) => z.iso.date({ error: `${label}: give the date as YYYY-MM-DD.` })

/** A medical clearance on file. No diagnosis or medical detail: the form and the page say so. */
export const clearanceSchema = z.object({
  clearedOn: isoDay('Cleared on'),
  validUntil: isoDay('Valid until').nullable().optional().or(z.literal('').transform(() => null)),
  clearedBy: plainText(160, 'Cleared by').min(1, { error: 'Cleared by: name the clinic or licensed health-care professional.' }),
  respiratorClasses: z.array(z.enum(classKeys, { error: 'Choose respirator classes from the list.' }), { error: 'Choose at least one respirator class.' })
    .min(1, { error: 'Choose at least one respirator class.' }).max(classKeys.length),
  restrictions: plainText(500, 'Restrictions').transform(v => v === '' ? null : v).nullable().optional()
}).refine(v => !v.validUntil || v.validUntil >= v.clearedOn, { error: 'Valid until cannot be before the clearance date.', path: ['validUntil'] })
export type ClearanceInput = z.input<typeof clearanceSchema>

export const dueListQuerySchema = z.object({
  siteId: z.uuid({ error: 'Choose a site from the list.' }).optional(),
  reason: z.enum(DUE_REASONS, { error: 'Choose a reason from the list.' }).optional(),
  q: z.string().trim().max(120).optional()
})
export type DueListQuery = z.output<typeof dueListQuerySchema>

const personIds = z.array(z.uuid({ error: 'Choose people from the list.' }), { error: 'Choose people from the list.' })
  .min(1, { error: 'Choose at least one person.' }).max(500, { error: 'Choose at most 500 people at a time.' })
export const remindNowSchema = z.object({ personIds })

export const reminderSettingsSchema = z.object({
  enabled: z.boolean({ error: 'Choose whether reminders go out.' }),
  leadDays: z.number({ error: 'Days before: enter a whole number.' }).int({ error: 'Days before: enter a whole number.' })
    .min(1, { error: 'Days before: at least 1.' }).max(180, { error: 'Days before: at most 180.' }),
  repeatDays: z.number({ error: 'Repeat every: enter a whole number of days.' }).int({ error: 'Repeat every: enter a whole number of days.' })
    .min(1, { error: 'Repeat every: at least 1 day.' }).max(90, { error: 'Repeat every: at most 90 days.' }),
  digestRoles: z.array(z.enum(['tester', 'admin'], { error: 'Digests go to testers or admins.' })).max(2)
})

export const CLEARANCE_AT_START = ['flag', 'require-reason', 'refuse'] as const
export const clearanceAtStartSettingSchema = z.object({ clearanceAtStart: z.enum(CLEARANCE_AT_START, { error: 'Choose one of the listed options.' }) })

export const discardSchema = z.object({
  reason: plainText(500, 'Reason').min(3, { error: 'Say why this draft is discarded (at least 3 characters).' })
})

export const assignRespiratorSchema = z.object({ respiratorModelId: z.uuid({ error: 'Choose a respirator from your catalogue.' }) })
export const respiratorParamSchema = z.object({ id: z.uuid(), modelId: z.uuid() })

export const linkPersonSchema = z.union([
  z.object({ userId: z.uuid({ error: 'Choose a wearer account.' }) }),
  z.object({ invite: z.literal(true), email: z.email({ error: 'Enter a valid e-mail address.' }).trim().toLowerCase().optional() })
], { error: 'Choose an account to link, or invite this person.' })

export const optOutSchema = z.object({ reminderOptOut: z.boolean({ error: 'Choose yes or no.' }) })

/** One CSV row of imported history, as strings; numbers go through the one number reader. */
export const importHistoryRowSchema = z.object({
  employeeNumber: plainText(40, 'Employee number').min(1, { error: 'Employee number: needed to find the person.' }),
  testedOn: isoDay('Last test date'),
  respirator: plainText(200, 'Respirator').min(1, { error: 'Respirator: give the make and model as in your catalogue.' }),
  size: plainText(20, 'Size').min(1, { error: 'Size: give the size tested.' }),
  result: z.string().trim().toLowerCase().pipe(z.enum(['pass', 'fail'], { error: 'Result: write pass or fail.' })),
  overallFitFactor: z.string().trim().max(40).optional(),
  tester: plainText(120, 'Tester').optional()
})

export const importClearanceRowSchema = z.object({
  employeeNumber: plainText(40, 'Employee number').min(1, { error: 'Employee number: needed to find the person.' }),
  clearedOn: isoDay('Cleared on'),
  validUntil: isoDay('Valid until').optional().or(z.literal('').transform(() => undefined)),
  clearedBy: plainText(160, 'Cleared by').min(1, { error: 'Cleared by: name the clinic or professional.' }),
  respiratorClasses: z.string().trim().max(400),
  restrictions: plainText(500, 'Restrictions').optional()
})

export const importRowsSchema = z.object({
  rows: z.array(z.unknown()).min(1, { error: 'There are no rows to import.' }).max(500, { error: 'Send at most 500 rows at a time.' }),
  firstRow: z.number().int().min(1).max(1_000_000).optional()
})
