import { eq } from 'drizzle-orm'
import { passLevelOverridesSchema } from '#shared/utils/pass-level-schemas'

/**
 * Replaces the organization's own pass levels (a level left out falls back to the rule set's).
 * A level below the rule set is refused, never raised silently. Finished records keep theirs.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'administer')
  const body = await parseBody(event, passLevelOverridesSchema)
  const organization = await findOrganization(caller.organizationId)
  const overrides = checkedOverrides(organization, body)
  const settings = { ...organization.settings, passLevelOverrides: overrides }
  await useDb().transaction(async (tx) => {
    await tx.update(schema.organizations).set({ settings }).where(eq(schema.organizations.id, caller.organizationId))
    await writeAudit(tx, caller, { entityType: 'organization', entityId: caller.organizationId, action: 'pass-levels-updated', before: organization.settings.passLevelOverrides ?? {}, after: overrides })
  })
  return passLevelView({ ...organization, settings })
})
