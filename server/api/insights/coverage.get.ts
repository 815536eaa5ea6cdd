/** Share of results covered by a readiness check, by counter and month. */
export default defineEventHandler(async (event) => {
  const { caller, filters } = await insightRequest(event)
  const { rows, withoutCounter } = await coverageSummaries(caller.organizationId, filters)
  return { withoutCounter, rows: rows.map(r => ({ ...r, share: rateOf(r.covered, r.tests) })) }
})
