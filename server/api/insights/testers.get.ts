/** Each tester's pass rate against the organization's, with binomial funnel limits. */
export default defineEventHandler(async (event) => {
  const { caller, filters } = await insightRequest(event)
  return testersWithFunnel(await testerSummaries(caller.organizationId, filters))
})
