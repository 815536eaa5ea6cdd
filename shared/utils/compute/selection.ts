import { SELECTION_CAUTIONS } from './cautions'
import type { ComputeIssue, ComputeResult } from './errors'
import { checkPositive, warningIssue } from './errors'
import type { RespiratorClass } from './respirator-classes'
import { RESPIRATOR_CLASSES } from './respirator-classes'

// Protection-factor selection: which respirator classes are adequate for a measured exposure,
// and their maximum use concentrations. 29 CFR 1910.134(d)(3)(i)(A)–(B). Exposure, exposure
// limit and IDLH share one unit (ppm or mg/m³: the caller keeps them consistent).

// Hazard ratio = measured exposure / exposure limit.
export function hazardRatio(exposure: number, exposureLimit: number): number {
  return exposure / exposureLimit
}

export interface MaximumUseConcentration {
  value: number
  // true when APF × exposure limit was above the IDLH value and the IDLH value is returned
  cappedAtIdlh: boolean
}

// MUC = APF × exposure limit, capped at the IDLH value where that is lower
// (29 CFR 1910.134(d)(3)(i)(B)(3), from memory). Never a basis for IDLH atmospheres
// ((d)(3)(i)(B)(2), from memory).
export function maximumUseConcentration(apf: number, exposureLimit: number, idlh?: number | null): MaximumUseConcentration {
  const raw = apf * exposureLimit
  if (idlh !== undefined && idlh !== null && idlh > 0 && idlh < raw) return { value: idlh, cappedAtIdlh: true }
  return { value: raw, cappedAtIdlh: false }
}

export interface AdequateClass {
  respiratorClass: RespiratorClass
  // null in an IDLH atmosphere: MUC is never used there
  muc: MaximumUseConcentration | null
}

export interface SelectionResult {
  hazardRatio: number
  // exposure at or above the IDLH value
  idlhAtmosphere: boolean
  // classes whose APF ≥ hazard ratio, lowest APF first (in an IDLH atmosphere: only the
  // classes accepted for IDLH)
  adequate: AdequateClass[]
  inadequate: RespiratorClass[]
  cautions: readonly string[]
}

export const IDLH_SELECTION_MESSAGE
  = 'The exposure is at or above the IDLH value. No air-purifying respirator is adequate and MUC does not apply: 29 CFR 1910.134(d)(2)(i) calls for a full facepiece pressure-demand SCBA, or a combination full facepiece pressure-demand supplied-air respirator with an auxiliary self-contained air supply (from memory).'

export interface SelectionInput {
  exposure: number
  exposureLimit: number
  idlh?: number | null
  classes?: readonly RespiratorClass[]
}

// Adequate classes for an exposure: APF ≥ hazard ratio (29 CFR 1910.134(d)(3)(i)(A)); in an
// IDLH atmosphere only the classes of (d)(2)(i), and no MUC at all.
export function selectRespirators(input: SelectionInput): ComputeResult<SelectionResult> {
  const issues: ComputeIssue[] = []
  const exposure = checkPositive(input.exposure, 'Measured exposure', { field: 'exposure' })
  const limit = checkPositive(input.exposureLimit, 'Exposure limit', { field: 'exposureLimit' })
  if (!exposure.ok) issues.push(exposure.issue)
  if (!limit.ok) issues.push(limit.issue)
  let idlh: number | null = null
  if (input.idlh !== undefined && input.idlh !== null) {
    const i = checkPositive(input.idlh, 'IDLH value', { field: 'idlh' })
    if (i.ok) idlh = i.value
    else issues.push(i.issue)
  }
  if (!exposure.ok || !limit.ok || issues.length) return { ok: false, issues }

  const ratio = hazardRatio(exposure.value, limit.value)
  const idlhAtmosphere = idlh !== null && exposure.value >= idlh
  const classes = [...(input.classes ?? RESPIRATOR_CLASSES)].sort((a, b) => a.apf - b.apf)
  const adequate: AdequateClass[] = []
  const inadequate: RespiratorClass[] = []
  for (const cls of classes) {
    const fits = idlhAtmosphere ? cls.idlhCapable : cls.apf >= ratio
    if (fits) {
      adequate.push({ respiratorClass: cls, muc: idlhAtmosphere ? null : maximumUseConcentration(cls.apf, limit.value, idlh) })
    } else {
      inadequate.push(cls)
    }
  }
  if (idlhAtmosphere) issues.push(warningIssue('idlh-atmosphere', IDLH_SELECTION_MESSAGE, { field: 'exposure' }))
  return {
    ok: true,
    issues,
    value: { hazardRatio: ratio, idlhAtmosphere, adequate, inadequate, cautions: SELECTION_CAUTIONS }
  }
}
