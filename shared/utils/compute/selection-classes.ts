import type { PassLevelRuleSetKey } from './pass-levels'
import type { RespiratorClass } from './respirator-classes'
import { RESPIRATOR_CLASSES, findRespiratorClass } from './respirator-classes'
import { SOURCE_FROM_MEMORY } from './sources'

// The respirator classes offered by the protection calculator for each rule set, with the
// catalogue classes (RESPIRATOR_CLASSES keys) a fit test on a model of that class counts for.

export interface SelectionClass extends RespiratorClass {
  // Catalogue classes whose fit tests count as being fitted for this class.
  catalogueClassKeys: readonly string[]
  // Something the catalogue cannot tell (a filter grade): shown beside a match.
  matchNote?: string
}

export const SELECTION_RULE_SET_LABELS: Readonly<Record<PassLevelRuleSetKey, string>> = {
  'us-osha': 'US OSHA, 29 CFR 1910.134(d)(3)(i)(A) Table 1',
  'uk-hse': 'UK HSE, HSG53'
}

const US_CLASSES: readonly SelectionClass[] = RESPIRATOR_CLASSES.map(c => ({ ...c, catalogueClassKeys: [c.key] }))

const HSG53 = 'HSE HSG53'
const HSG53_CONFIRMED = `${HSG53} (confirmed by secondary summaries)`
const HSG53_FROM_MEMORY = `${HSG53} (value ${SOURCE_FROM_MEMORY})`
const GRADE_NOTE = 'The catalogue does not record the filter grade: confirm the fitted model carries it.'

function ukClass(key: string, label: string, base: string, apf: number, apfSource: string, extra: Partial<SelectionClass> = {}): SelectionClass {
  const from = findRespiratorClass(base)!
  return { ...from, key, label, apf, apfSource, catalogueClassKeys: [base], idlhCapable: false, note: undefined, ...extra }
}

// UK protection factors as DOMAIN.md gives them: FFP1–3 confirmed by secondary summaries, the
// rest from memory and labelled so on screen.
const UK_CLASSES: readonly SelectionClass[] = [
  ukClass('uk-ffp1', 'Filtering facepiece FFP1', 'filtering-facepiece', 4, HSG53_CONFIRMED, { matchNote: GRADE_NOTE }),
  ukClass('uk-ffp2', 'Filtering facepiece FFP2', 'filtering-facepiece', 10, HSG53_CONFIRMED, { matchNote: GRADE_NOTE }),
  ukClass('uk-ffp3', 'Filtering facepiece FFP3', 'filtering-facepiece', 20, HSG53_CONFIRMED, { matchNote: GRADE_NOTE }),
  ukClass('uk-half-mask-p3', 'Half mask with P3 filter', 'elastomeric-half-mask', 20, HSG53_FROM_MEMORY, { matchNote: GRADE_NOTE }),
  ukClass('uk-full-face-p3', 'Full face mask with P3 filter', 'elastomeric-full-facepiece', 40, HSG53_FROM_MEMORY, { matchNote: GRADE_NOTE }),
  ukClass('uk-powered-hood-th3', 'Powered hood or helmet, TH3', 'papr-helmet-hood', 40, HSG53_FROM_MEMORY, { catalogueClassKeys: ['papr-helmet-hood', 'papr-loose-fitting-facepiece'] }),
  ukClass('uk-powered-full-face-tm3', 'Powered full face mask, TM3', 'papr-full-facepiece', 40, HSG53_FROM_MEMORY),
  ukClass('uk-scba-positive-pressure', 'Breathing apparatus, positive pressure, full face', 'scba-pressure-demand-full-facepiece', 2000, HSG53_FROM_MEMORY, { idlhCapable: true })
]

export function selectionClassesFor(ruleSet: PassLevelRuleSetKey): readonly SelectionClass[] {
  return ruleSet === 'uk-hse' ? UK_CLASSES : US_CLASSES
}

export function findSelectionClass(ruleSet: PassLevelRuleSetKey, key: string): SelectionClass | undefined {
  return selectionClassesFor(ruleSet).find(c => c.key === key)
}
