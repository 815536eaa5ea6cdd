import { eq } from 'drizzle-orm'
import { MAX_CUSTOM_PROTOCOLS, customProtocolSchema } from '#shared/utils/protocol-admin-schemas'

/** Adds a custom protocol, checked with the computation module's protocol schema. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const protocol = await parseBody(event, customProtocolSchema)
  const org = await findOrganization(caller.organizationId)
  const existing = customProtocolsOf(org)
  if (existing.some(p => p.key === protocol.key)) {
    throw httpError(409, `Your program already has a protocol with the key '${protocol.key}'.`, { fieldErrors: { key: 'Choose a key no other protocol uses.' } })
  }
  if (existing.some(p => p.name.toLowerCase() === protocol.name.toLowerCase())) {
    throw httpError(409, `Your program already has a protocol named '${protocol.name}'.`, { fieldErrors: { name: 'Choose a name no other protocol uses.' } })
  }
  if (existing.length >= MAX_CUSTOM_PROTOCOLS) {
    throw httpError(409, `A program may keep at most ${MAX_CUSTOM_PROTOCOLS} custom protocols; remove one first.`)
  }
  const settings = { ...org.settings, customProtocols: [...existing, protocol] }
  await useDb().transaction(async (tx) => {
    await tx.update(schema.organizations).set({ settings }).where(eq(schema.organizations.id, caller.organizationId))
    await writeAudit(tx, caller, { entityType: 'organization', entityId: caller.organizationId, action: 'protocol-added', after: protocol })
  })
  setResponseStatus(event, 201)
  return protocol
})
