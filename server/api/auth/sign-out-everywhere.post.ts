// Ends this user's sessions on every device and browser, this one included.
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event)
  await useDb().transaction(async (tx) => {
    await endAllSessions(tx, caller.id)
    await writeAudit(tx, caller, { entityType: 'user', entityId: caller.id, action: 'signed-out-everywhere' })
  })
  await clearUserSession(event)
  return { signedOut: true, everywhere: true }
})
