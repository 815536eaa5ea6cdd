import { findRespiratorClass } from './compute'
import type { FacepieceKind, SelectionClass } from './compute'
import { coveringClearance } from './oversight'
import type { ClearanceRecord, RespiratorStanding } from './oversight'

// Who is protected for a job: for each person assigned to an exposure assessment, whether they
// hold a current passing fit test on a respirator of a class the assessment allows, and a current
// medical clearance covering that class (29 CFR 1910.134(e)(1): evaluated before being fit tested
// or using the respirator). Each requirement is one condition; a person is protected only when
// every condition is met, and every unmet one is named.
//
// Fit standing comes from the program-oversight rules (`respiratorStandings`): one line per
// respirator model, where a failed test newer than the last pass makes the line 'failed', so a
// later failure on the same model cancels the earlier pass here exactly as it does on the due list.

export type ConditionKey = 'fit-test' | 'medical-clearance'

export interface ProtectionCondition {
  key: ConditionKey
  met: boolean
  message: string
  recordId?: string
}

export interface PersonProtection {
  protected: boolean
  conditions: ProtectionCondition[]
  // The first unmet condition, in words: the gap to close.
  gap: string | null
  notes: string[]
}

const FACEPIECE_WORDS: Readonly<Record<FacepieceKind, string>> = {
  'filtering-facepiece': 'a filtering facepiece',
  'quarter-mask': 'a quarter mask',
  'half-mask': 'a half mask',
  'full-facepiece': 'a full facepiece',
  'helmet-hood': 'a helmet or hood',
  'loose-fitting-facepiece': 'a loose-fitting facepiece'
}

function listWords(words: string[]): string {
  const unique = [...new Set(words)]
  if (unique.length <= 1) return unique[0] ?? ''
  return `${unique.slice(0, -1).join(', ')} or ${unique.at(-1)}`
}

function neededWords(classes: readonly SelectionClass[]): string {
  return `${listWords(classes.map(c => FACEPIECE_WORDS[c.facepiece]))}: ${listWords(classes.map(c => c.label.toLowerCase()))}`
}

export interface ProtectionInput {
  // Classes the assessment allows: its chosen classes, or every adequate class while none is chosen.
  allowedClasses: readonly SelectionClass[]
  // The person's fit standing per respirator model (oversight's `respiratorStandings`).
  respirators: readonly RespiratorStanding[]
  // The person's medical clearance records (any age).
  clearances: readonly ClearanceRecord[]
  // YYYY-MM-DD
  today: string
}

// A standing that lets the wearer use the respirator today: latest test passed, not past its due date.
function isCurrent(r: RespiratorStanding): boolean {
  return r.status === 'current' || r.status === 'due-soon'
}

function respiratorName(r: Pick<RespiratorStanding, 'make' | 'model'>): string {
  return `${r.make} ${r.model}`
}

function facepieceOf(classKey: string): string {
  const cls = findRespiratorClass(classKey)
  return cls ? FACEPIECE_WORDS[cls.facepiece] : classKey
}

export function protectionFor(input: ProtectionInput): PersonProtection {
  const notes: string[] = []
  const fit = fitCondition(input, notes)
  const clearance = clearanceCondition(input, fit.wornClasses, notes)
  const conditions = [fit.condition, clearance]
  const unmet = conditions.filter(c => !c.met)
  return { protected: unmet.length === 0, conditions, gap: unmet.length ? unmet.map(c => c.message).join(' ') : null, notes }
}

function fitCondition({ allowedClasses, respirators, clearances, today }: ProtectionInput, notes: string[]): { condition: ProtectionCondition, wornClasses: string[] } {
  const allKeys = [...new Set(allowedClasses.flatMap(c => c.catalogueClassKeys))]
  if (allowedClasses.length === 0) {
    return { condition: { key: 'fit-test', met: false, message: 'No respirator class is adequate for this job in the assessment.' }, wornClasses: [] }
  }
  const fitted = allowedClasses.filter(c => c.tightFitting)
  const loose = allowedClasses.filter(c => !c.tightFitting)
  if (loose.length) notes.push(`${listWords(loose.map(c => c.label))} needs no fit test (loose-fitting).`)
  const keys = new Set(fitted.flatMap(c => c.catalogueClassKeys))
  const matching = respirators.filter(r => keys.has(r.respiratorClass))
    .sort((a, b) => (b.dueOn ?? '').localeCompare(a.dueOn ?? ''))
  // Among the respirators the person may wear, prefer one their clearance covers.
  const current = matching.filter(isCurrent)
  const worn = current.find(r => coveringClearance([...clearances], r.respiratorClass, today)) ?? current[0]
  if (worn) {
    const cls = allowedClasses.find(c => c.catalogueClassKeys.includes(worn.respiratorClass))
    if (cls?.matchNote) notes.push(cls.matchNote)
    const pass = worn.lastPass!
    if (pass.source === 'imported') notes.push('The fit test relied on here is imported history: whether a readiness check covered it is not known.')
    return {
      condition: { key: 'fit-test', met: true, message: `Fitted: ${respiratorName(worn)}, size ${pass.size}, passed ${pass.testedOn}, due ${worn.dueOn}.`, ...(pass.fitTestId ? { recordId: pass.fitTestId } : {}) },
      wornClasses: [worn.respiratorClass]
    }
  }
  if (loose.length) {
    return {
      condition: { key: 'fit-test', met: true, message: `Protected without a fit test only when wearing ${listWords(loose.map(c => c.label.toLowerCase()))}.` },
      wornClasses: [...new Set(loose.flatMap(c => c.catalogueClassKeys))]
    }
  }
  const needs = neededWords(fitted)
  const failed = matching.filter(r => r.status === 'failed' && r.latest)
    .sort((a, b) => b.latest!.testedOn.localeCompare(a.latest!.testedOn))[0]
  if (failed) {
    const earlier = failed.lastPass ? ` The earlier pass of ${failed.lastPass.testedOn} no longer counts.` : ''
    return {
      condition: { key: 'fit-test', met: false, message: `Latest fit test on ${respiratorName(failed)} (${failed.latest!.testedOn}) did not pass.${earlier} This job needs ${needs}: retest.`, ...(failed.latest!.fitTestId ? { recordId: failed.latest!.fitTestId } : {}) },
      wornClasses: allKeys
    }
  }
  const expired = matching.find(r => r.status === 'overdue')
  if (expired) {
    return {
      condition: { key: 'fit-test', met: false, message: `Fit test on ${respiratorName(expired)} expired on ${expired.dueOn ?? 'an unknown date'}; this job needs ${needs}: retest.`, ...(expired.lastPass?.fitTestId ? { recordId: expired.lastPass.fitTestId } : {}) },
      wornClasses: allKeys
    }
  }
  const otherCurrent = respirators.filter(isCurrent)
  if (otherCurrent.length) {
    const words = listWords(otherCurrent.map(r => `${facepieceOf(r.respiratorClass)} (${respiratorName(r)})`))
    return { condition: { key: 'fit-test', met: false, message: `Fitted for ${words}; this job needs ${needs}.` }, wornClasses: allKeys }
  }
  return { condition: { key: 'fit-test', met: false, message: `No current passing fit test; this job needs ${needs}.` }, wornClasses: allKeys }
}

/**
 * A current clearance covering the class the person would wear (or, while they are not fitted,
 * any class the job allows). The gap names the facepiece: "No current medical clearance for a
 * full facepiece". Restrictions are not repeated here; the person's page shows them.
 */
function clearanceCondition({ clearances, today }: ProtectionInput, wornClasses: string[], notes: string[]): ProtectionCondition {
  for (const cls of wornClasses) {
    const covering = coveringClearance([...clearances], cls, today)
    if (!covering) continue
    if (covering.restrictions?.trim()) notes.push('The medical clearance relied on here carries restrictions: read them on the person\'s page.')
    return { key: 'medical-clearance', met: true, message: `Medically cleared ${covering.clearedOn} by ${covering.clearedBy}, ${covering.validUntil ? `valid until ${covering.validUntil}` : 'no end date recorded'}.`, recordId: covering.id }
  }
  const facepieces = listWords(wornClasses.map(facepieceOf))
  const what = facepieces || 'this job\'s respirator'
  const lapsed = clearances.filter(c => wornClasses.some(k => c.respiratorClasses.includes(k)) && c.validUntil !== null && c.validUntil < today)
    .sort((a, b) => (b.validUntil ?? '').localeCompare(a.validUntil ?? ''))[0]
  if (lapsed) return { key: 'medical-clearance', met: false, message: `No current medical clearance for ${what}: the last one lapsed on ${lapsed.validUntil}.`, recordId: lapsed.id }
  const future = clearances.find(c => wornClasses.some(k => c.respiratorClasses.includes(k)) && c.clearedOn > today)
  if (future) return { key: 'medical-clearance', met: false, message: `No current medical clearance for ${what}: the one on file starts on ${future.clearedOn}.` }
  const onFile = clearances.filter(c => c.clearedOn <= today && (c.validUntil === null || c.validUntil >= today))
  if (onFile.length) {
    const covers = listWords(onFile.flatMap(c => c.respiratorClasses).map(facepieceOf))
    return { key: 'medical-clearance', met: false, message: `No current medical clearance for ${what}: the clearance on file covers ${covers} only.` }
  }
  return { key: 'medical-clearance', met: false, message: `No current medical clearance for ${what}.` }
}
