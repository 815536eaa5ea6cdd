import { remindNowSchema } from '#shared/utils/oversight-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { personIds } = await parseBody(event, remindNowSchema)
  const result = await remindNow(caller, personIds, await programToday(caller.organizationId), true)
  await writeAudit(useDb(), caller, { entityType: 'reminder', entityId: 'manual', action: 'sent', after: { sent: result.sent, personIds } })
  return result
})
