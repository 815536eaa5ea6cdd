import { clearanceSchema } from '#shared/utils/oversight-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

/** Records a medical clearance: dates, who cleared, classes covered, restrictions. Never a diagnosis. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, clearanceSchema)
  await findPerson(caller.organizationId, id)
  const row = await useDb().transaction(async (tx) => {
    const [created] = await tx.insert(schema.medicalClearances).values({ ...input, validUntil: input.validUntil ?? null, restrictions: input.restrictions ?? null, organizationId: caller.organizationId, personId: id, recordedByUserId: caller.id }).returning()
    await writeAudit(tx, caller, { entityType: 'medical-clearance', entityId: created!.id, action: 'created', after: { personId: id, clearedOn: input.clearedOn, validUntil: input.validUntil ?? null, respiratorClasses: input.respiratorClasses } })
    return created!
  })
  setResponseStatus(event, 201)
  return clearanceView(row)
})
