import { z } from 'zod'
import { calendarDate, changesSchema, pageNumber } from './input-ranges'
import { MEDICAL_CLEARANCE_STATUSES } from './enums'
import { PERSON_STATUSES } from './status-labels'

const statuses = MEDICAL_CLEARANCE_STATUSES

const optionalText = (max: number, label: string) => z.string().trim().max(max, { error: `${label}: use at most ${max} characters.` })
  .transform(v => v === '' ? null : v).nullable().optional()

export const personSchema = z.object({
  fullName: z.string({ error: 'Enter the person\'s name.' }).trim().min(1, { error: 'Enter the person\'s name.' }).max(120, { error: 'Use at most 120 characters.' }),
  employeeNumber: optionalText(40, 'Employee number'),
  siteId: z.uuid({ error: 'Choose a site from the list.' }).nullable().optional(),
  jobTitle: optionalText(120, 'Job'),
  email: z.string().trim().toLowerCase().transform(v => v === '' ? null : v)
    .pipe(z.email({ error: 'Enter a valid e-mail address, or leave it empty.' }).nullable()).nullable().optional(),
  medicalClearanceOn: calendarDate('Give the clearance date as YYYY-MM-DD.', 'today').nullable().optional()
    .or(z.literal('').transform(() => null)),
  medicalClearanceStatus: z.enum(statuses, { error: `Medical clearance is one of: ${statuses.join(', ')}.` }).default('pending'),
  notes: optionalText(2000, 'Notes')
})
export type PersonInput = z.input<typeof personSchema>

export const updatePersonSchema = changesSchema(personSchema).extend({
  active: z.boolean({ error: 'Choose active or not.' }).optional(),
  reminderOptOut: z.boolean({ error: 'Choose whether this person gets reminder e-mail.' }).optional()
})

export const listPeopleQuerySchema = z.object({
  q: z.string().trim().max(120).optional(),
  siteId: z.uuid({ error: 'Choose a site from the list.' }).optional(),
  status: z.enum(PERSON_STATUSES).optional(),
  sort: z.enum(['fullName', 'employeeNumber', 'nextDueOn']).default('fullName'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  page: pageNumber,
  pageSize: z.coerce.number().int().min(1).max(200).default(25)
})

/** Import: each row as the CSV gave it (strings), with the site named rather than by id. */
export const importPersonRowSchema = personSchema.omit({ siteId: true }).extend({
  siteName: z.string().trim().max(120).optional()
})
export const importPeopleSchema = z.object({
  rows: z.array(z.unknown()).min(1, { error: 'There are no rows to import.' }).max(500, { error: 'Send at most 500 rows at a time.' })
})

/** Fit status from the next due date: due within 30 days counts as "due soon". */
export function personFitStatus(nextDueOn: string | null, today: string): PersonFitStatus {
  if (!nextDueOn) return 'never-tested'
  if (nextDueOn < today) return 'overdue'
  const soon = new Date(`${today}T00:00:00Z`)
  soon.setUTCDate(soon.getUTCDate() + 30)
  return nextDueOn <= soon.toISOString().slice(0, 10) ? 'due-soon' : 'current'
}
