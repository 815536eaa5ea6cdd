export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'trainer', 'tester', 'reviewer')
  return { sets: await listPracticeSets(caller.organizationId), practice: true }
})
