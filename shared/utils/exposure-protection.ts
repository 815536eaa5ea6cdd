import { findRespiratorClass } from './compute'
import type { FacepieceKind, SelectionClass } from './compute'

// Who is protected for a job: for each person assigned to an exposure assessment, whether they
// hold a current passing fit test on a respirator of a class the assessment allows. Each
// requirement is one condition, so a medical-clearance condition can be added beside the fit one
// once clearance records exist; a person is protected only when every condition is met.

export interface FitRecordSummary {
  id: string
  respiratorClass: string
  respirator: string
  size: string
  performedOn: string
  dueOn: string | null
}

export type ConditionKey = 'fit-test'

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

function fittedWords(records: FitRecordSummary[]): string {
  return listWords(records.map((r) => {
    const cls = findRespiratorClass(r.respiratorClass)
    return `${cls ? FACEPIECE_WORDS[cls.facepiece] : r.respiratorClass} (${r.respirator})`
  }))
}

function neededWords(classes: readonly SelectionClass[]): string {
  return `${listWords(classes.map(c => FACEPIECE_WORDS[c.facepiece]))}: ${listWords(classes.map(c => c.label.toLowerCase()))}`
}

export interface ProtectionInput {
  // Classes the assessment allows: its chosen classes, or every adequate class while none is chosen.
  allowedClasses: readonly SelectionClass[]
  // The person's finished, passing fit tests (any age); superseded and withdrawn ones left out.
  passingFitTests: FitRecordSummary[]
  // YYYY-MM-DD
  today: string
}

export function protectionFor(input: ProtectionInput): PersonProtection {
  const notes: string[] = []
  const fit = fitCondition(input, notes)
  const conditions = [fit]
  const unmet = conditions.find(c => !c.met)
  return { protected: !unmet, conditions, gap: unmet?.message ?? null, notes }
}

function fitCondition({ allowedClasses, passingFitTests, today }: ProtectionInput, notes: string[]): ProtectionCondition {
  if (allowedClasses.length === 0) {
    return { key: 'fit-test', met: false, message: 'No respirator class is adequate for this job in the assessment.' }
  }
  const fitted = allowedClasses.filter(c => c.tightFitting)
  if (fitted.length < allowedClasses.length) {
    const loose = allowedClasses.filter(c => !c.tightFitting)
    notes.push(`${listWords(loose.map(c => c.label))} needs no fit test (loose-fitting).`)
  }
  const keys = new Set(fitted.flatMap(c => c.catalogueClassKeys))
  const matching = passingFitTests.filter(t => keys.has(t.respiratorClass))
    .sort((a, b) => (b.dueOn ?? '').localeCompare(a.dueOn ?? ''))
  const current = matching.find(t => t.dueOn !== null && t.dueOn >= today)
  if (current) {
    const cls = allowedClasses.find(c => c.catalogueClassKeys.includes(current.respiratorClass))
    if (cls?.matchNote) notes.push(cls.matchNote)
    return { key: 'fit-test', met: true, message: `Fitted: ${current.respirator}, size ${current.size}, passed ${current.performedOn}, due ${current.dueOn}.`, recordId: current.id }
  }
  if (fitted.length < allowedClasses.length) {
    return { key: 'fit-test', met: true, message: `Protected without a fit test only when wearing ${listWords(allowedClasses.filter(c => !c.tightFitting).map(c => c.label.toLowerCase()))}.` }
  }
  const needs = neededWords(fitted)
  if (matching[0]) {
    return { key: 'fit-test', met: false, message: `Fit test on ${matching[0].respirator} expired on ${matching[0].dueOn ?? 'an unknown date'}; this job needs ${needs}: retest.`, recordId: matching[0].id }
  }
  const otherCurrent = passingFitTests.filter(t => t.dueOn !== null && t.dueOn >= today)
  if (otherCurrent.length) {
    return { key: 'fit-test', met: false, message: `Fitted for ${fittedWords(otherCurrent)}; this job needs ${needs}.` }
  }
  return { key: 'fit-test', met: false, message: `No current passing fit test; this job needs ${needs}.` }
}
