import type { NumberFormat } from '#shared/utils/settings-schemas'

/** How this organization writes numbers, for every form that reads a typed or pasted number. */
export default defineEventHandler(async (event): Promise<NumberFormat> => {
  const caller = await requireRole(event)
  return { decimalMark: decimalMarkOf(await findOrganization(caller.organizationId)) }
})
