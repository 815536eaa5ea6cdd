// Cautions to show wherever a result could hurt someone if misread (a pass, an MUC, a selection).
// Wording from DOMAIN.md, "Cautions to show". Pages display them; the module never hides them.

export const CAUTION_FIT_FACTOR_SCOPE
  = 'A fit factor measures this face, this mask, this day; it is not a guarantee in the workplace.'

export const CAUTION_MUC_NOT_FOR_IDLH = 'Never use MUC for IDLH atmospheres.'

export const CAUTION_QUALIFIED_PEOPLE
  = 'Respirator selection, medical clearance and program decisions belong to qualified people under the local regulations; Sealwright computes and records, it does not certify.'

export const CAUTION_LOCAL_REGULATIONS
  = 'Pass levels and protection factors differ between jurisdictions; follow the regulations that apply where the respirator is used.'

export const FIT_TEST_CAUTIONS: readonly string[] = [
  CAUTION_FIT_FACTOR_SCOPE,
  CAUTION_QUALIFIED_PEOPLE,
  CAUTION_LOCAL_REGULATIONS
]

export const SELECTION_CAUTIONS: readonly string[] = [
  CAUTION_MUC_NOT_FOR_IDLH,
  CAUTION_QUALIFIED_PEOPLE,
  CAUTION_LOCAL_REGULATIONS
]

export const HEADFORM_CAUTIONS: readonly string[] = [
  'A bench protection factor checks this mask unit on a headform; it says nothing about the fit on a wearer.',
  CAUTION_QUALIFIED_PEOPLE
]
