import { remindNowSchema } from '#shared/utils/oversight-schemas'

/** What "remind now" would send to each chosen person, and who would be skipped and why. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { personIds } = await parseBody(event, remindNowSchema)
  return remindNow(caller, personIds, await programToday(caller.organizationId), false)
})
