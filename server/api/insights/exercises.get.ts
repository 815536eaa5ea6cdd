/** Which exercise breaks the seal, by canonical movement, per protocol and per model. */
export default defineEventHandler(async (event) => {
  const { caller, filters } = await insightRequest(event)
  return { rows: await exerciseSummaries(caller.organizationId, filters) }
})
