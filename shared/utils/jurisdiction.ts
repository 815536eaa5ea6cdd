// The pass-levels leaf, not the computation index: the fit-test list and the verification page
// import this file, and the index brings the statistics and CSV libraries along.
import { PASS_LEVEL_RULE_SETS } from './compute/pass-levels'
import type { PassLevelRuleSetKey } from './compute/pass-levels'

// The citations a record, a fit card and a verification page carry, by the organization's rule set
// (DOMAIN.md, "Jurisdiction"). A UK record never cites 29 CFR 1910.134(m)(2).

export interface RecordCitations {
  ruleSetLabel: string
  /** Under what the record is kept. */
  record: string
  /** What the fit test follows. */
  fitTesting: string
  /** Where the pass level comes from. */
  passLevel: string
  /** Where assigned protection factors come from. */
  protectionFactors: string
  /** Why the next test falls due when it does. */
  retest: string
}

export const RECORD_CITATIONS: Readonly<Record<PassLevelRuleSetKey, RecordCitations>> = {
  'us-osha': {
    ruleSetLabel: PASS_LEVEL_RULE_SETS['us-osha'].label,
    record: '29 CFR 1910.134(m)(2)',
    fitTesting: '29 CFR 1910.134(f) and Appendix A',
    passLevel: PASS_LEVEL_RULE_SETS['us-osha'].source,
    protectionFactors: '29 CFR 1910.134(d)(3)(i)(A) Table 1',
    retest: '29 CFR 1910.134(f)(2): at least every 12 months'
  },
  'uk-hse': {
    ruleSetLabel: PASS_LEVEL_RULE_SETS['uk-hse'].label,
    record: 'HSE INDG479 (fit test records)',
    fitTesting: 'HSE INDG479',
    passLevel: PASS_LEVEL_RULE_SETS['uk-hse'].source,
    protectionFactors: 'HSE HSG53',
    retest: 'the program\'s retest interval (HSE INDG479 asks for repeat testing; interval set by the program)'
  }
}

/** Citations for a rule set; an unknown key falls back to nothing rather than to another country's law. */
export function recordCitations(ruleSet: string): RecordCitations | null {
  return RECORD_CITATIONS[ruleSet as PassLevelRuleSetKey] ?? null
}
