import { BUILT_IN_PROTOCOLS } from '#shared/utils/compute'

/** Built-in and custom protocols, for everyone who records or reads fit tests. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const org = await findOrganization(caller.organizationId)
  return { builtIn: BUILT_IN_PROTOCOLS, custom: customProtocolsOf(org) }
})
