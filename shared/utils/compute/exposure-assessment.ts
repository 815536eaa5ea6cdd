import { CAUTION_LOCAL_REGULATIONS, CAUTION_MUC_NOT_FOR_IDLH, CAUTION_QUALIFIED_PEOPLE } from './cautions'
import type { ComputeIssue, ComputeResult } from './errors'
import { checkNonNegative, checkPositive, errorIssue, warningIssue } from './errors'
import type { ConcentrationUnit, ExposureSegment } from './exposure'
import { CONCENTRATION_UNIT_LABELS, convertConcentration, timeWeightedAverage } from './exposure'
import type { PassLevelRuleSetKey } from './pass-levels'
import type { MaximumUseConcentration } from './selection'
import { IDLH_SELECTION_MESSAGE, hazardRatio, maximumUseConcentration } from './selection'
import type { SelectionClass } from './selection-classes'
import { selectionClassesFor } from './selection-classes'

// The protection calculator: from measured exposures to the required protection factor and the
// adequate respirator classes with their MUCs. Pure: the page previews it as the hygienist types,
// the server recomputes it from the stored inputs.

export const LIMIT_KINDS = ['twa-8h', 'stel', 'ceiling'] as const
export type LimitKind = typeof LIMIT_KINDS[number]
export const LIMIT_KIND_LABELS: Readonly<Record<LimitKind, string>> = {
  'twa-8h': '8-hour TWA',
  'stel': 'Short-term (STEL)',
  'ceiling': 'Ceiling'
}

export const SUBSTANCE_FORMS = ['gas-vapour', 'particulate', 'fibre'] as const
export type SubstanceForm = typeof SUBSTANCE_FORMS[number]
export const SUBSTANCE_FORM_LABELS: Readonly<Record<SubstanceForm, string>> = {
  'gas-vapour': 'Gas or vapour',
  'particulate': 'Dust, mist or fume',
  'fibre': 'Fibres'
}

export const CAUTION_COMPLETE_PROGRAM
  = 'An assigned protection factor is reached only inside a complete program: fit testing, training, medical clearance, maintenance and supervision.'
export const CAUTION_APF_JURISDICTION
  = 'Assigned protection factors differ between jurisdictions; this result uses the organization\'s rule set only.'
export const CAUTION_MIXTURE_ADDITIVE
  = 'Add substances into one mixture index only when they act on the same organs or systems (29 CFR 1910.1000(d)(2)(i)); otherwise judge each on its own.'
export const CAUTION_CHANGE_SCHEDULE
  = 'Gases and vapours: use cartridges with an end-of-service-life indicator or a written change schedule (29 CFR 1910.134(d)(3)(iii)(B), from memory).'
export const CAUTION_MUC_MIXTURE
  = 'Each substance\'s MUC assumes the others are absent; for the mixture the class must cover the mixture index.'

export const UK_IDLH_NOTE
  = 'Under the UK rule set Sealwright applies the same restriction (positive-pressure breathing apparatus only); confirm it against HSG53 with a competent person.'

export const ASSESSMENT_CAUTIONS: readonly string[] = [
  CAUTION_COMPLETE_PROGRAM,
  CAUTION_MUC_NOT_FOR_IDLH,
  CAUTION_QUALIFIED_PEOPLE,
  CAUTION_APF_JURISDICTION,
  CAUTION_LOCAL_REGULATIONS
]

export type ExposureEntry
  = | { mode: 'single', value: number | null, unit: ConcentrationUnit }
    | { mode: 'segments', unit: ConcentrationUnit, segments: ExposureSegment[] }

export interface ContaminantInput {
  name: string
  form: SubstanceForm
  molecularWeight?: number | null
  exposure: ExposureEntry
  limit: { value: number | null, unit: ConcentrationUnit, kind: LimitKind, source: string }
  // In the unit of the limit; null when not known.
  idlh?: number | null
}

export interface AssessmentInput {
  ruleSet: PassLevelRuleSetKey
  contaminants: ContaminantInput[]
  // Several substances acting on the same organs: E_m of 1910.1000(d)(2)(i).
  additiveMixture: boolean
  oxygenDeficient: boolean
}

export interface ContaminantResult {
  name: string
  // Exposure in the limit's unit, and as entered when that differs.
  exposure: number
  exposureAsEntered: number
  exposureUnitAsEntered: ConcentrationUnit
  converted: boolean
  twaHours: number | null
  limit: number
  limitUnit: ConcentrationUnit
  limitKind: LimitKind
  limitSource: string
  idlh: number | null
  hazardRatio: number
  atOrAboveIdlh: boolean
}

export interface ClassResult {
  selectionClass: SelectionClass
  adequate: boolean
  // One per substance, in its limit's unit; null in an IDLH atmosphere (MUC never applies there).
  mucs: (MaximumUseConcentration | null)[]
}

export interface AssessmentResult {
  contaminants: ContaminantResult[]
  mixtureIndex: number | null
  requiredProtectionFactor: number
  idlhAtmosphere: boolean
  classes: ClassResult[]
  cautions: string[]
}

export function exposureAsEnteredOf(entry: ExposureEntry, field: string): ComputeResult<{ value: number, twaHours: number | null }> {
  if (entry.mode === 'segments') {
    const twa = timeWeightedAverage(entry.segments, `${field}.segments`)
    if (!twa.ok) return twa
    return { ok: true, issues: twa.issues, value: { value: twa.value.twa, twaHours: twa.value.sampledHours } }
  }
  const v = checkNonNegative(entry.value, 'Measured exposure', { field: `${field}.value` })
  if (!v.ok) return { ok: false, issues: [v.issue] }
  return { ok: true, issues: [], value: { value: v.value, twaHours: null } }
}

function evaluateContaminant(c: ContaminantInput, i: number): ComputeResult<ContaminantResult> {
  const at = `contaminants.${i}`
  const who = c.name.trim() || `substance ${i + 1}`
  const issues: ComputeIssue[] = []
  const limit = checkPositive(c.limit.value, `Exposure limit of ${who}`, { field: `${at}.limit.value` })
  if (!limit.ok) issues.push(limit.issue)
  const exposure = exposureAsEnteredOf(c.exposure, `${at}.exposure`)
  issues.push(...exposure.issues)
  if (c.exposure.mode === 'segments' && c.limit.kind !== 'twa-8h') {
    issues.push(errorIssue('invalid-setting', `A ${LIMIT_KIND_LABELS[c.limit.kind].toLowerCase()} limit is compared with the short-term or peak measurement, not an 8-hour TWA: enter the measured concentration`, { field: `${at}.exposure.mode` }))
  }
  let idlh: number | null = null
  if (c.idlh !== undefined && c.idlh !== null) {
    const v = checkPositive(c.idlh, `IDLH of ${who}`, { field: `${at}.idlh` })
    if (!v.ok) issues.push(v.issue)
    else if (limit.ok && v.value < limit.value) {
      issues.push(errorIssue('invalid-setting', `The IDLH of ${who} (${v.value}) is below its exposure limit (${limit.value}); check both values and their unit`, { field: `${at}.idlh` }))
    } else idlh = v.value
  }
  if (!limit.ok || !exposure.ok || issues.some(x => x.severity === 'error')) return { ok: false, issues }

  const converted = convertConcentration(exposure.value.value, c.exposure.unit, c.limit.unit, c.molecularWeight, `${at}.molecularWeight`)
  if (!converted.ok) {
    return { ok: false, issues: converted.issues.map(x => ({ ...x, field: x.field === 'exposure.unit' ? `${at}.exposure.unit` : x.field })) }
  }
  const ratio = hazardRatio(converted.value, limit.value)
  return {
    ok: true,
    issues,
    value: {
      name: who,
      exposure: converted.value,
      exposureAsEntered: exposure.value.value,
      exposureUnitAsEntered: c.exposure.unit,
      converted: c.exposure.unit !== c.limit.unit,
      twaHours: exposure.value.twaHours,
      limit: limit.value,
      limitUnit: c.limit.unit,
      limitKind: c.limit.kind,
      limitSource: c.limit.source,
      idlh,
      hazardRatio: ratio,
      atOrAboveIdlh: idlh !== null && converted.value >= idlh
    }
  }
}

// Required protection factor = hazard ratio (for an additive mixture, E_m); a class is adequate
// when its APF ≥ that — 29 CFR 1910.134(d)(3)(i)(A). In an IDLH or oxygen-deficient atmosphere
// only the classes of (d)(2)(i) are adequate and no MUC is given.
export function evaluateExposureAssessment(input: AssessmentInput): ComputeResult<AssessmentResult> {
  const issues: ComputeIssue[] = []
  if (input.contaminants.length === 0) {
    return { ok: false, issues: [errorIssue('missing', 'Add at least one substance', { field: 'contaminants' })] }
  }
  const results: ContaminantResult[] = []
  input.contaminants.forEach((c, i) => {
    const r = evaluateContaminant(c, i)
    issues.push(...r.issues)
    if (r.ok) results.push(r.value)
  })
  if (results.length !== input.contaminants.length) return { ok: false, issues }

  const mixture = input.additiveMixture && results.length > 1
  const mixtureIndex = mixture ? results.reduce((sum, r) => sum + r.hazardRatio, 0) : null
  if (mixture && new Set(results.map(r => r.limitKind)).size > 1) {
    issues.push(warningIssue('invalid-setting', 'The mixture adds limits of different kinds (TWA, STEL, ceiling); 29 CFR 1910.1000(d)(2)(i) adds exposures judged over the same period', { field: 'additiveMixture' }))
  }
  const requiredProtectionFactor = mixtureIndex ?? Math.max(...results.map(r => r.hazardRatio))
  const idlhAtmosphere = input.oxygenDeficient || results.some(r => r.atOrAboveIdlh)
  if (idlhAtmosphere) {
    const uk = input.ruleSet === 'uk-hse' ? ` ${UK_IDLH_NOTE}` : ''
    const message = `${input.oxygenDeficient ? 'The air is oxygen-deficient. ' : ''}${IDLH_SELECTION_MESSAGE}${uk}`
    issues.push(warningIssue('idlh-atmosphere', message, { field: input.oxygenDeficient ? 'oxygenDeficient' : 'contaminants' }))
  }

  const classes = [...selectionClassesFor(input.ruleSet)].sort((a, b) => a.apf - b.apf).map((cls): ClassResult => ({
    selectionClass: cls,
    adequate: idlhAtmosphere ? cls.idlhCapable : cls.apf >= requiredProtectionFactor,
    mucs: results.map(r => idlhAtmosphere ? null : maximumUseConcentration(cls.apf, r.limit, r.idlh))
  }))

  const cautions = [...ASSESSMENT_CAUTIONS]
  if (mixture) cautions.push(CAUTION_MIXTURE_ADDITIVE, CAUTION_MUC_MIXTURE)
  if (input.contaminants.some(c => c.form === 'gas-vapour')) cautions.push(CAUTION_CHANGE_SCHEDULE)
  return { ok: true, issues, value: { contaminants: results, mixtureIndex, requiredProtectionFactor, idlhAtmosphere, classes, cautions } }
}

export function concentrationText(value: number, unit: ConcentrationUnit): string {
  return `${value} ${CONCENTRATION_UNIT_LABELS[unit]}`
}
