import type { z } from 'zod'
import { findBuiltInProtocol, resolvePassLevel } from '#shared/utils/compute'
import type { PassLevelRuleSetKey, Protocol } from '#shared/utils/compute'
import { localDay } from '#shared/utils/clock'
import { retestIntervalMonths, storedFieldsOf } from '#shared/utils/fit-test-evaluate'
import type { createFitTestSchema } from '#shared/utils/fit-test-schemas'
import { PRE_TEST_ITEMS, unmetPreTestItems } from '#shared/utils/fit-test-schemas'

// The rules a fit-test revision is held to (pass level, result, readiness, state); the queries
// that read and lock revisions are in fit-test-queries.ts.

export type FitTestRow = typeof schema.fitTests.$inferSelect
type Organization = typeof schema.organizations.$inferSelect

export function passLevelFor(org: Organization, respiratorClass: string) {
  const resolved = resolvePassLevel({ ruleSet: org.ruleSet as PassLevelRuleSetKey, respiratorClass, overrides: org.settings.passLevelOverrides })
  if (!resolved.ok) {
    throw httpError(409, resolved.issues[0]?.message ?? 'This respirator has no pass level.')
  }
  return resolved.value
}

/**
 * The server's own result for a revision, recomputed from the raw inputs only: nothing the client
 * computed is ever read. Qualitative tests carry the recorded pass or fail.
 */
export function computeStoredResult(row: Pick<FitTestRow, 'kind' | 'protocol' | 'entry' | 'seriesText' | 'sampleFlowCm3PerMin' | 'respiratorClass' | 'performedAt'> & Partial<Pick<FitTestRow, 'status' | 'passLevel'>>, org: Organization, timeZone: string) {
  // A finished record keeps the pass level it was finished against: a level raised or lowered
  // later never changes the verdict of a record already issued.
  const keptLevel = row.status && row.status !== 'draft' && row.passLevel !== null && row.passLevel !== undefined ? row.passLevel : null
  return storedFieldsOf({
    kind: row.kind,
    protocol: row.protocol as Protocol | null,
    entry: row.entry,
    seriesText: row.seriesText,
    sampleFlowCm3PerMin: row.sampleFlowCm3PerMin,
    passLevel: row.kind === 'qualitative' ? null : keptLevel ?? passLevelFor(org, row.respiratorClass).level,
    testedOn: localDay(row.performedAt, timeZone),
    retestMonths: retestIntervalMonths(org.settings.retestIntervalMonths)
  })
}

export function protocolFor(protocolKey: string, kind: 'quantitative' | 'qualitative', org?: Pick<Organization, 'settings'>): Protocol | null {
  if (kind === 'qualitative') return null
  const protocol = org ? findOfferedProtocol(org, protocolKey) : findBuiltInProtocol(protocolKey)
  if (!protocol) {
    throw httpError(400, 'Choose a quantitative protocol for a quantitative test.', { fieldErrors: { protocolKey: 'Choose a quantitative protocol.' } })
  }
  return protocol
}

export type CreateFitTestInput = z.output<typeof createFitTestSchema>

/** Refuses to finish a test whose pre-test items are not all met, naming each one. */
export function assertReadyToFinish(row: FitTestRow, evaluationOk: boolean, firstIssue?: string) {
  const unmet = unmetPreTestItems(row.preTest)
  if (unmet.length) {
    throw httpError(409, `The test cannot be finished: ${unmet.map(k => PRE_TEST_ITEMS[k]).join('; ')} — not confirmed.`, { unmet })
  }
  if (row.kind === 'qualitative' && !row.entry.qualitative) {
    throw httpError(409, 'Record the agent and whether the wearer passed before finishing.')
  }
  if (row.kind === 'quantitative' && !evaluationOk) {
    throw httpError(409, `The test cannot be finished yet: ${firstIssue ?? 'some results are missing'}.`)
  }
}

export function assertDraft(row: FitTestRow) {
  if (row.status !== 'draft') {
    throw httpError(409, 'This record is finished and locked. To correct it, start a revision with a reason.')
  }
}

export function staleDraftError(currentVersion?: number) {
  return httpError(409, 'Someone else saved this draft after you opened it. Reload to see their changes; your typing is still on screen.', { currentVersion })
}

export function assertVersion(row: FitTestRow, version: number) {
  if (row.version !== version) throw staleDraftError(row.version)
}
