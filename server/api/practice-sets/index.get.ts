export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-practice')
  return { sets: await listPracticeSets(caller.organizationId), practice: true }
})
