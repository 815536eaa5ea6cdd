export default defineEventHandler(async (event) => {
  const caller = await requireRole(event)
  return caller
})
