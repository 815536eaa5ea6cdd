import type { H3Event } from 'h3'
import { binomialFunnelLimits, funnelPosition, wilsonInterval } from '#shared/utils/compute'
import { INSIGHT_MIN_TESTS, insightFiltersSchema } from '#shared/utils/insight-schemas'
import type { InsightFilters } from '#shared/utils/insight-schemas'

/** Reviewers and admins use insights; testers read them. Filters from the query, checked. */
export async function insightRequest(event: H3Event): Promise<{ caller: Caller, filters: InsightFilters }> {
  const caller = await requireRole(event, 'see-insights')
  const filters = parseQuery(event, insightFiltersSchema)
  return { caller, filters }
}

/** A rate with its Wilson 95 % interval (Wilson 1927), or without one when the group is small. */
export function rateOf(successes: number, trials: number) {
  if (trials === 0) return { successes, trials, rate: null, lower: null, upper: null, small: true }
  const rate = successes / trials
  if (trials < INSIGHT_MIN_TESTS) return { successes, trials, rate, lower: null, upper: null, small: true }
  const w = wilsonInterval(successes, trials)
  return { successes, trials, rate, lower: w.lower, upper: w.upper, small: false }
}

/** Testers against the organization's rate, with binomial funnel limits (Spiegelhalter 2005). */
export function testersWithFunnel(testers: { testerUserId: string, testerName: string, tests: number, passed: number }[]) {
  const total = testers.reduce((a, t) => a + t.tests, 0)
  const passed = testers.reduce((a, t) => a + t.passed, 0)
  const orgRate = total > 0 ? passed / total : null
  const rows = testers.map((t) => {
    const rate = t.tests > 0 ? t.passed / t.tests : null
    if (orgRate === null || rate === null || t.tests < INSIGHT_MIN_TESTS) return { ...t, rate, limits: null, position: null, small: true }
    const limits = binomialFunnelLimits(t.tests, orgRate)
    return { ...t, rate, limits, position: funnelPosition(rate, limits), small: false }
  })
  const maxN = Math.max(0, ...testers.map(t => t.tests))
  const curve = orgRate === null || maxN < 1 ? [] : funnelCurve(maxN, orgRate)
  return { organization: { tests: total, passed, rate: orgRate }, testers: rows, curve }
}

function funnelCurve(maxN: number, p: number) {
  const ns = new Set<number>()
  for (let i = 0; i <= 40; i++) ns.add(Math.max(INSIGHT_MIN_TESTS, Math.round(INSIGHT_MIN_TESTS * (Math.max(maxN * 1.1, INSIGHT_MIN_TESTS + 1) / INSIGHT_MIN_TESTS) ** (i / 40))))
  return [...ns].sort((a, b) => a - b).map(n => binomialFunnelLimits(n, p))
}
