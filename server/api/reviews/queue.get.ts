import { insightFiltersSchema } from '#shared/utils/insight-schemas'

/** Finished results awaiting countersign, oldest first, with coverage beside each. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'review')
  const filters = parseQuery(event, insightFiltersSchema)
  const { rows, total } = await reviewQueue(caller.organizationId, filters)
  const coverage = await findCoverageMany(caller.organizationId, rows.map(r => ({ ...r, performedAt: new Date(r.performedAt) })))
  return { total, rows: rows.map(r => ({ ...r, coverage: coverage.get(r.id) ?? null })) }
})
