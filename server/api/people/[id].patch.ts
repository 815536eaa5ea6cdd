import { and, eq } from 'drizzle-orm'
import { updatePersonSchema } from '#shared/utils/person-schemas'
import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { id } = parseParams(event, idParamSchema)
  const parsed = await parseBody(event, updatePersonSchema)
  // Only the fields the body carries change; everything else stays as it was.
  const changes = Object.fromEntries(Object.entries(parsed).filter(([, v]) => v !== undefined)) as typeof parsed
  const before = await findPerson(caller.organizationId, id)
  if (Object.keys(changes).length === 0) return personView(before)
  await assertSiteOf(caller.organizationId, changes.siteId)
  const p = schema.people
  return useDb().transaction(async (tx) => {
    const [row] = await tx.update(p).set(changes).where(and(eq(p.organizationId, caller.organizationId), eq(p.id, id))).returning()
    await writeAudit(tx, caller, { entityType: 'person', entityId: id, action: 'updated', before, after: changes })
    return personView(row!)
  })
})
