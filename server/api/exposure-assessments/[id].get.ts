import { evaluateExposureAssessment } from '#shared/utils/compute/exposure-assessment'
import { assessmentIdSchema } from '#shared/utils/exposure-schemas'

/** One revision with the server's own result, its history, its assignments and who is protected. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const { id } = parseParams(event, assessmentIdSchema)
  const row = await findAssessment(caller.organizationId, id)
  const ruleSet = row.ruleSet === 'uk-hse' ? 'uk-hse' : 'us-osha'
  const [revisions, assignments, people, names, sites] = await Promise.all([
    revisionsOf(caller.organizationId, row.recordId),
    assignmentsOf(caller.organizationId, row.recordId),
    protectedPeopleOf(caller.organizationId, [row], await programToday(caller.organizationId)),
    userNames([row.createdByUserId, row.signedOffByUserId]),
    listSites(caller.organizationId)
  ])
  return {
    assessment: {
      ...assessmentView(row),
      siteName: sites.find(s => s.id === row.siteId)?.name ?? null,
      createdBy: names.get(row.createdByUserId) ?? null,
      signedOffBy: row.signedOffByUserId ? names.get(row.signedOffByUserId) ?? null : null
    },
    result: evaluateExposureAssessment({ ruleSet, ...row.input }),
    revisions,
    assignments,
    people: people.get(row.recordId) ?? []
  }
})
