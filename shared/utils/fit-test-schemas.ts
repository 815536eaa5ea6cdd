import { z } from 'zod'
import { calendarDate, changesSchema, databaseInteger, pageNumber, pastInstant } from './input-ranges'
import { DECIMAL_MARKS } from './number-reader'
import type { DecimalMark } from './number-reader'
import { FIT_TEST_KINDS } from './enums'

/**
 * Items checked before a fit test starts. Any one not met blocks the test:
 * a facepiece may not be fit tested with anything crossing the sealing surface — 29 CFR 1910.134(g)(1)(i);
 * the wearer performs a user seal check — (g)(1)(iii); medical evaluation comes first — (e)(1);
 * the wearer judges comfort before the test — App. A Part I.A.5 (paragraph from memory).
 */
export const PRE_TEST_ITEMS = {
  medicalClearanceCurrent: 'Medical clearance is current for this respirator',
  nothingCrossingSeal: 'Nothing crosses the sealing surface (facial hair, jewellery, glasses arms) — 29 CFR 1910.134(g)(1)(i)',
  userSealCheckDone: 'The wearer performed a user seal check — 29 CFR 1910.134(g)(1)(iii)',
  comfortAcceptable: 'The wearer finds the fit comfortable enough to wear for the shift'
} as const
export type PreTestItem = keyof typeof PRE_TEST_ITEMS
export const PRE_TEST_KEYS = Object.keys(PRE_TEST_ITEMS) as PreTestItem[]

export const preTestSchema = z.object({
  medicalClearanceCurrent: z.boolean().default(false),
  nothingCrossingSeal: z.boolean().default(false),
  userSealCheckDone: z.boolean().default(false),
  comfortAcceptable: z.boolean().default(false)
})
export type PreTestChecks = z.infer<typeof preTestSchema>

export function unmetPreTestItems(checks: PreTestChecks): PreTestItem[] {
  return PRE_TEST_KEYS.filter(key => !checks[key])
}

// A concentration field as typed: empty is allowed while a draft is incomplete; the computation
// module then names the exercise and field still missing.
const concentration = z.number({ error: 'Enter a number of particles per cm³.' })
  .nonnegative({ error: 'A concentration cannot be negative.' })
  .max(1e9, { error: 'That concentration is beyond any counter\'s range; check the decimal point.' })
  .nullable().default(null)

export const exerciseEntrySchema = z.object({
  exerciseKey: z.string().min(1).max(60),
  ambientBefore: concentration,
  ambientAfter: concentration,
  ambientMean: concentration,
  inMask: concentration,
  inMaskCount: z.number().int({ error: 'A particle count is a whole number.' }).nonnegative()
    .max(1e12, { error: 'That count is beyond any counter\'s range; check the number.' }).nullable().default(null)
})

export const QUALITATIVE_AGENTS = {
  'saccharin': 'Saccharin solution aerosol',
  'denatonium-benzoate': 'Denatonium benzoate solution aerosol',
  'isoamyl-acetate': 'Isoamyl acetate (banana oil)',
  'irritant-smoke': 'Irritant smoke (stannic chloride)'
} as const
export type QualitativeAgent = keyof typeof QUALITATIVE_AGENTS

export const ENTRY_MODES = ['grid', 'series', 'qualitative'] as const

export const fitTestEntrySchema = z.object({
  mode: z.enum(ENTRY_MODES, { error: 'Choose how results are entered: grid, series or qualitative.' }).default('grid'),
  exercises: z.array(exerciseEntrySchema).max(40).default([]),
  wholeTestAmbient: z.object({ start: concentration, end: concentration }).nullable().default(null),
  /** Seconds to shift a pasted series so its first reading lines up with the protocol's start. */
  seriesOffsetSeconds: z.number().min(-3600).max(3600).default(0),
  /**
   * The decimal mark a pasted series is read with, kept with the record so it recomputes the same
   * after the organization changes its setting. Absent on older records: point.
   */
  decimalMark: z.enum(DECIMAL_MARKS as [DecimalMark, ...DecimalMark[]], { error: 'Choose a point or a comma as the decimal mark.' }).optional(),
  qualitative: z.object({
    agent: z.enum(Object.keys(QUALITATIVE_AGENTS) as [QualitativeAgent, ...QualitativeAgent[]], { error: 'Choose the test agent.' }),
    result: z.enum(['pass', 'fail'], { error: 'Choose pass or fail.' })
  }).nullable().default(null)
})
export type FitTestEntry = z.infer<typeof fitTestEntrySchema>

export const QUALITATIVE_PROTOCOL_KEY = 'qualitative-app-a'

const isoInstant = pastInstant('Give the test time as a date and time.')

export const createFitTestSchema = z.object({
  idempotencyKey: z.string().min(8, { error: 'The idempotency key is too short.' }).max(100),
  kind: z.enum(FIT_TEST_KINDS).default('quantitative'),
  personId: z.uuid({ error: 'Choose the person being tested.' }),
  respiratorModelId: z.uuid({ error: 'Choose the respirator model.' }),
  respiratorSize: z.string({ error: 'Choose the size.' }).trim().min(1, { error: 'Choose the size.' }).max(40),
  // A built-in protocol, the qualitative one, or one of the organization's own (the route looks it up).
  protocolKey: z.string({ error: 'Choose a protocol.' }).trim().min(1, { error: 'Choose a protocol.' }).max(80, { error: 'Choose a protocol.' }),
  counterId: z.uuid({ error: 'Choose the counter used.' }).nullable().default(null),
  /** The serial-numbered unit worn, when the model's units are tracked. */
  maskUnitId: z.uuid({ error: 'Choose the mask unit the wearer wears.' }).nullable().default(null),
  siteId: z.uuid({ error: 'Choose the site.' }),
  performedAt: isoInstant.optional(),
  preTest: preTestSchema.default({ medicalClearanceCurrent: false, nothingCrossingSeal: false, userSealCheckDone: false, comfortAcceptable: false }),
  entry: fitTestEntrySchema.optional(),
  seriesText: z.string().max(2_000_000, { error: 'The series is larger than 2 MB; split it or use a 1 Hz export.' }).nullable().optional(),
  /** Why the test goes ahead without a current medical clearance covering this respirator class. */
  clearanceReason: z.string({ error: 'Write the reason as text.' }).trim().max(500, { error: 'Use at most 500 characters.' })
    .refine(v => ![...v].some(ch => ch.charCodeAt(0) < 32 && ch !== '\n'), { error: 'Remove the control characters.' }).optional()
}).refine(v => v.kind === 'qualitative' || v.counterId !== null, { error: 'Choose the counter used.', path: ['counterId'] })
export type CreateFitTest = z.input<typeof createFitTestSchema>

export const updateFitTestSchema = z.object({
  version: databaseInteger('The draft version is missing; reload the page.').positive(),
  respiratorSize: z.string().trim().min(1, { error: 'Choose the size.' }).max(40).optional(),
  counterId: z.uuid({ error: 'Choose the counter used.' }).nullable().optional(),
  maskUnitId: z.uuid({ error: 'Choose the mask unit the wearer wears.' }).nullable().optional(),
  performedAt: isoInstant.optional(),
  // Each pre-test item and each part of the entry sent replaces only itself; the exercises are one list.
  preTest: changesSchema(preTestSchema).optional(),
  entry: changesSchema(fitTestEntrySchema).optional(),
  seriesText: z.string().max(2_000_000, { error: 'The series is larger than 2 MB.' }).nullable().optional()
})
export type UpdateFitTest = z.input<typeof updateFitTestSchema>

export const finishFitTestSchema = z.object({
  version: databaseInteger('The draft version is missing; reload the page.').positive()
})

export const reasonSchema = z.object({
  reason: z.string({ error: 'Give a reason.' }).trim().min(5, { error: 'Give a reason of at least a few words.' }).max(500)
})

export const FIT_TEST_SORTS = ['performedAt', 'overallFitFactor', 'person'] as const

export const listFitTestsQuerySchema = z.object({
  personId: z.uuid().optional(),
  siteId: z.uuid().optional(),
  result: z.enum(['pass', 'fail', 'draft', 'withdrawn']).optional(),
  kind: z.enum(FIT_TEST_KINDS).optional(),
  from: calendarDate('From must be a date (YYYY-MM-DD).').optional(),
  to: calendarDate('To must be a date (YYYY-MM-DD).').optional(),
  q: z.string().trim().max(120).optional(),
  sort: z.enum(FIT_TEST_SORTS).default('performedAt'),
  dir: z.enum(['asc', 'desc']).default('desc'),
  page: pageNumber,
  pageSize: z.coerce.number().int().min(1).max(200).default(25)
})
export type ListFitTestsQuery = z.infer<typeof listFitTestsQuerySchema>
