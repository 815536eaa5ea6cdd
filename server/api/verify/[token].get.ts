import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { localDay } from '#shared/utils/clock'
import { COVERAGE_FLAG_TEXT, coverageFlagOf, verificationState } from '#shared/utils/fit-card-rules'
import { recordCitations } from '#shared/utils/jurisdiction'

const paramsSchema = z.object({ token: z.string().min(20).max(100) })

function initials(name: string) {
  return name.split(/\s+/).filter(Boolean).map(part => `${part[0]!.toUpperCase()}.`).join(' ')
}

/**
 * Public: what a fit card's QR code opens. Only initials, respirator, size, dates, the state of the
 * revision the card was printed from, and whether a readiness check covered it. A superseded card
 * points to nothing: the corrected record stays private.
 */
export default defineEventHandler(async (event) => {
  const { token } = parseParams(event, paramsSchema)
  const [card] = await useDb().select().from(schema.fitCards).where(eq(schema.fitCards.token, token))
  const revision = card ? await cardRevision(card) : null
  if (!card || !revision) throw httpError(404, 'This card is not known. It may have been copied wrongly.')
  const [[person], site, org] = await Promise.all([
    useDb().select({ fullName: schema.people.fullName }).from(schema.people).where(eq(schema.people.id, revision.personId)),
    findSite(card.organizationId, revision.siteId),
    findOrganization(card.organizationId)
  ])
  const coverage = revision.counterId ? await findCoverage(card.organizationId, { counterId: revision.counterId, siteId: revision.siteId, performedAt: revision.performedAt }) : null
  const flag = coverageFlagOf(coverage)
  const today = localDay(new Date(), site.timeZone)
  const state = verificationState({ status: revision.status, passed: revision.passed, coverage: flag, uncoveredResults: org.settings.uncoveredResults, dueOn: revision.dueOn, today })
  setResponseHeader(event, 'Cache-Control', 'no-store')
  return {
    state,
    coverage: flag,
    coverageText: COVERAGE_FLAG_TEXT[flag],
    initials: initials(person?.fullName ?? ''),
    respirator: `${revision.respiratorMake} ${revision.respiratorModel}`,
    size: revision.respiratorSize,
    testedOn: localDay(revision.performedAt, site.timeZone),
    dueOn: revision.passed ? revision.dueOn : null,
    checkedOn: today,
    fitTesting: recordCitations(org.ruleSet)?.fitTesting ?? null
  }
})
