/** Pass rates by month or quarter: all attempts and first attempts, with Wilson 95 % intervals. */
export default defineEventHandler(async (event) => {
  const { caller, filters } = await insightRequest(event)
  const periods = await passRatesByPeriod(caller.organizationId, filters)
  return {
    bucket: filters.bucket,
    periods: periods.map(p => ({ period: p.period, all: rateOf(p.passed, p.tests), first: rateOf(p.firstPassed, p.firstTests) }))
  }
})
