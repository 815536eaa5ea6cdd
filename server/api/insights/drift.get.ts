/** People whose fit is drifting on one model (Theil–Sen slope of ln FF; flags of assessDrift). */
export default defineEventHandler(async (event) => {
  const { caller, filters } = await insightRequest(event)
  return await driftingPeople(caller.organizationId, filters)
})
