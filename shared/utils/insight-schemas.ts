import { z } from 'zod'

/** Below this many tests a row shows its numbers but no interval and no flag. */
export const INSIGHT_MIN_TESTS = 10
/** Drift: flag when the latest fit factor is below this fraction of the person's own median. */
export const DRIFT_DROP_FRACTION = 0.5
export const DRIFT_MIN_TESTS = 3

const emptyToUndefined = (v: unknown) => (v === '' || v === null ? undefined : v)

/** The filters every insights panel and the review queue take from the URL. */
export const insightFiltersSchema = z.object({
  siteId: z.preprocess(emptyToUndefined, z.uuid({ error: 'Choose a site from the list.' }).optional()),
  from: z.preprocess(emptyToUndefined, z.iso.date({ error: 'Give the start date as YYYY-MM-DD.' }).optional()),
  to: z.preprocess(emptyToUndefined, z.iso.date({ error: 'Give the end date as YYYY-MM-DD.' }).optional()),
  protocolKey: z.preprocess(emptyToUndefined, z.string().trim().min(1).max(80, { error: 'Choose a protocol from the list.' }).regex(/^[a-z0-9-]+$/, { error: 'Choose a protocol from the list.' }).optional()),
  respiratorModelId: z.preprocess(emptyToUndefined, z.uuid({ error: 'Choose a respirator model from the list.' }).optional()),
  respiratorSize: z.preprocess(emptyToUndefined, z.string().trim().min(1).max(40, { error: 'A size has at most 40 characters.' }).refine(v => ![...v].some(c => c.charCodeAt(0) < 32), { error: 'Choose a size from the list.' }).optional()),
  testerUserId: z.preprocess(emptyToUndefined, z.uuid({ error: 'Choose a tester from the list.' }).optional()),
  bucket: z.preprocess(emptyToUndefined, z.enum(['month', 'quarter'], { error: 'Group by month or quarter.' }).default('month'))
}).refine(f => !f.from || !f.to || f.from <= f.to, { error: 'The start date must not be after the end date.', path: ['to'] })
export type InsightFilters = z.output<typeof insightFiltersSchema>

export const INSIGHT_FILTER_KEYS = ['siteId', 'from', 'to', 'protocolKey', 'respiratorModelId', 'respiratorSize', 'testerUserId', 'bucket'] as const

/**
 * Reads filters from a URL query one field at a time: a field that cannot be read is dropped and
 * named, so the page resets only that field and says why.
 */
export function readInsightFilters(query: Record<string, unknown>): { filters: InsightFilters, dropped: { field: string, message: string }[] } {
  const clean: Record<string, unknown> = {}
  const dropped: { field: string, message: string }[] = []
  for (const key of INSIGHT_FILTER_KEYS) {
    const raw = Array.isArray(query[key]) ? (query[key] as unknown[])[0] : query[key]
    if (raw === undefined) continue
    const one = insightFiltersSchema.safeParse({ [key]: raw })
    if (one.success) clean[key] = raw
    else dropped.push({ field: key, message: one.error.issues[0]?.message ?? 'could not be read' })
  }
  const all = insightFiltersSchema.safeParse(clean)
  if (all.success) return { filters: all.data, dropped }
  delete clean.to
  dropped.push({ field: 'to', message: all.error.issues[0]?.message ?? 'could not be read' })
  return { filters: insightFiltersSchema.parse(clean), dropped }
}

const commentText = (label: string, required: boolean) => {
  const base = z.string({ error: `${label}: write some text.` }).trim().max(2000, { error: `${label}: use at most 2000 characters.` })
    .refine(v => !v.includes('\u0000'), { error: `${label}: remove the control characters.` })
  return required ? base.min(1, { error: `${label}: write what needs checking.` }) : base
}

export const countersignSchema = z.object({
  comment: z.preprocess(v => (v === null ? undefined : v), commentText('Comment', false).optional())
})
export const raiseQuerySchema = z.object({ question: commentText('Question', true) })
export const answerQuerySchema = z.object({ answer: commentText('Answer', true) })
export const queryParamsSchema = z.object({ id: z.uuid(), queryId: z.uuid() })
