/** Respirator models and sizes: first-attempt pass rate, geometric mean and GSD, distribution. */
export default defineEventHandler(async (event) => {
  const { caller, filters } = await insightRequest(event)
  const rows = await modelSummaries(caller.organizationId, filters)
  return { rows: rows.map(r => ({ ...r, firstAttempt: rateOf(r.firstPassed, r.firstTests), all: rateOf(r.passed, r.tests) })) }
})
