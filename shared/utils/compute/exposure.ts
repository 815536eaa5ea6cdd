import { create, divideDependencies, multiplyDependencies, unitDependencies } from 'mathjs'
import type { FactoryFunctionMap, Unit } from 'mathjs'
import type { ComputeIssue, ComputeResult } from './errors'
import { checkNonNegative, checkPositive, errorIssue, warningIssue } from './errors'

// Only the unit functions of mathjs, so the rest of the library stays out of the page bundle.
const { divide, multiply, unit } = create({ divideDependencies, multiplyDependencies, unitDependencies } as FactoryFunctionMap)

// Exposure arithmetic for the protection calculator: the 8-hour TWA, the additive-mixture index
// and ppm ↔ mg/m³. Each function is pure and reports problems as issues naming the field.

export const CONCENTRATION_UNITS = ['ppm', 'mg/m3', 'f/cm3', 'particles/cm3'] as const
export type ConcentrationUnit = typeof CONCENTRATION_UNITS[number]

export const CONCENTRATION_UNIT_LABELS: Readonly<Record<ConcentrationUnit, string>> = {
  'ppm': 'ppm',
  'mg/m3': 'mg/m³',
  'f/cm3': 'fibres/cm³',
  'particles/cm3': 'particles/cm³'
}

// Molar volume of an ideal gas at 25 °C and 760 mmHg, the conditions of the ppm columns of the
// 29 CFR 1910.1000 Z tables (verified in a state rule that reproduces them).
export const MOLAR_VOLUME_L_PER_MOL_25C = 24.45

// 29 CFR 1910.1000(d)(1)(i) divides by the 8-hour shift.
export const TWA_SHIFT_HOURS = 8
export const MAX_SEGMENT_HOURS = 24

export const TWA_ASSUMPTION
  = 'The 8-hour TWA is Σ(concentration × hours) ÷ 8 (29 CFR 1910.1000(d)(1)(i)). It assumes an 8-hour shift: every hour of the shift needs a segment, and an hour with no exposure must be entered as a segment at 0.'

// ppm ↔ mg/m³ through the molecular weight: mg/m³ = ppm × MW ÷ 24.45. mathjs carries the units,
// so g/mol ÷ L/mol × volume fraction comes out as a mass per volume that converts to mg/m³.
export function ppmToMgPerM3(ppm: number, molecularWeight: number): number {
  const perVolume = multiply(divide(unit(molecularWeight, 'g/mol'), unit(MOLAR_VOLUME_L_PER_MOL_25C, 'L/mol')), ppm * 1e-6)
  return (perVolume as unknown as Unit).toNumber('mg/m^3')
}

export function mgPerM3ToPpm(mgPerM3: number, molecularWeight: number): number {
  const moles = divide(unit(mgPerM3, 'mg/m^3'), unit(molecularWeight, 'g/mol'))
  // mathjs gives a plain number once the units cancel to a volume fraction.
  const fraction = multiply(moles, unit(MOLAR_VOLUME_L_PER_MOL_25C, 'L/mol')) as unknown
  const value = typeof fraction === 'number' ? fraction : (fraction as Unit).toNumber('')
  return value * 1e6
}

export function unitsConvertible(from: ConcentrationUnit, to: ConcentrationUnit): boolean {
  if (from === to) return true
  return (from === 'ppm' && to === 'mg/m3') || (from === 'mg/m3' && to === 'ppm')
}

// A concentration in another unit. ppm ↔ mg/m³ needs the molecular weight; fibres and particles
// convert to nothing else.
export function convertConcentration(
  value: number,
  from: ConcentrationUnit,
  to: ConcentrationUnit,
  molecularWeight?: number | null,
  field = 'molecularWeight'
): ComputeResult<number> {
  if (from === to) return { ok: true, value, issues: [] }
  if (!unitsConvertible(from, to)) {
    return {
      ok: false,
      issues: [errorIssue('invalid-setting', `${CONCENTRATION_UNIT_LABELS[from]} cannot be converted to ${CONCENTRATION_UNIT_LABELS[to]}; enter the exposure in the unit of the limit`, { field: 'exposure.unit' })]
    }
  }
  const mw = checkPositive(molecularWeight, 'Molecular weight (needed to convert ppm and mg/m³)', { field })
  if (!mw.ok) return { ok: false, issues: [mw.issue] }
  const converted = from === 'ppm' ? ppmToMgPerM3(value, mw.value) : mgPerM3ToPpm(value, mw.value)
  return { ok: true, value: converted, issues: [] }
}

export interface ExposureSegment {
  concentration: number
  hours: number
}

export interface TimeWeightedAverage {
  twa: number
  sampledHours: number
  // Σ C·T before dividing by 8
  concentrationHours: number
}

// E = (C_a·T_a + C_b·T_b + … + C_n·T_n) ÷ 8 — 29 CFR 1910.1000(d)(1)(i). Fewer than 8 hours of
// segments is refused: dividing by 8 would count the missing hours as clean air, a result more
// favourable than what was measured. More than 8 (up to 24) is computed as the paragraph writes it
// and flagged.
export function timeWeightedAverage(segments: readonly ExposureSegment[], fieldPrefix = 'segments'): ComputeResult<TimeWeightedAverage> {
  const issues: ComputeIssue[] = []
  if (segments.length === 0) {
    return { ok: false, issues: [errorIssue('missing', 'Add at least one segment: a concentration and the hours it lasted', { field: fieldPrefix })] }
  }
  let concentrationHours = 0
  let sampledHours = 0
  segments.forEach((segment, i) => {
    const c = checkNonNegative(segment.concentration, `Concentration of segment ${i + 1}`, { field: `${fieldPrefix}.${i}.concentration` })
    const t = checkPositive(segment.hours, `Hours of segment ${i + 1}`, { field: `${fieldPrefix}.${i}.hours` })
    if (!c.ok) issues.push(c.issue)
    if (!t.ok) issues.push(t.issue)
    if (c.ok && t.ok) {
      concentrationHours += c.value * t.value
      sampledHours += t.value
    }
  })
  if (issues.length) return { ok: false, issues }
  if (sampledHours > MAX_SEGMENT_HOURS) {
    return { ok: false, issues: [errorIssue('invalid-setting', `The segments add up to ${roundHours(sampledHours)} h, more than a day (24 h); check the hours`, { field: fieldPrefix })] }
  }
  if (sampledHours < TWA_SHIFT_HOURS) {
    return {
      ok: false,
      issues: [errorIssue('invalid-setting', `The segments add up to ${roundHours(sampledHours)} h. The 8-hour TWA divides by 8 h, so the missing ${roundHours(TWA_SHIFT_HOURS - sampledHours)} h would count as clean air: add a segment for them (at 0 only if you know there was no exposure)`, { field: fieldPrefix })]
    }
  }
  if (sampledHours > TWA_SHIFT_HOURS) {
    issues.push(warningIssue('invalid-setting', `The segments add up to ${roundHours(sampledHours)} h. Σ(C·T) is still divided by 8 as 29 CFR 1910.1000(d)(1)(i) writes it, which gives more than the average over the whole shift; a qualified person decides how a long shift is judged`, { field: fieldPrefix }))
  }
  return { ok: true, issues, value: { twa: concentrationHours / TWA_SHIFT_HOURS, sampledHours, concentrationHours } }
}

function roundHours(h: number): string {
  return String(Math.round(h * 100) / 100)
}

export interface MixtureComponent {
  exposure: number
  limit: number
}

// E_m = C₁/L₁ + C₂/L₂ + … + C_n/L_n, which must not exceed 1 — 29 CFR 1910.1000(d)(2)(i).
// Each exposure in the unit of its own limit.
export function mixtureExposureIndex(components: readonly MixtureComponent[]): ComputeResult<number> {
  const issues: ComputeIssue[] = []
  let sum = 0
  components.forEach((c, i) => {
    const e = checkNonNegative(c.exposure, `Exposure of substance ${i + 1}`, { field: `contaminants.${i}.exposure` })
    const l = checkPositive(c.limit, `Exposure limit of substance ${i + 1}`, { field: `contaminants.${i}.limit.value` })
    if (!e.ok) issues.push(e.issue)
    if (!l.ok) issues.push(l.issue)
    if (e.ok && l.ok) sum += e.value / l.value
  })
  if (components.length === 0) issues.push(errorIssue('missing', 'Add at least one substance', { field: 'contaminants' }))
  if (issues.length) return { ok: false, issues }
  return { ok: true, issues, value: sum }
}

// Rounding for display that never flatters: a ratio the wearer must be protected against is
// rounded up, a concentration that may be worn in is rounded down.
export function roundUpSignificant(value: number, digits = 3): number {
  return roundSignificant(value, digits, Math.ceil)
}

export function roundDownSignificant(value: number, digits = 3): number {
  return roundSignificant(value, digits, Math.floor)
}

function roundSignificant(value: number, digits: number, round: (x: number) => number): number {
  if (!Number.isFinite(value) || value === 0) return value
  const magnitude = Math.floor(Math.log10(Math.abs(value)))
  const factor = 10 ** (digits - 1 - magnitude)
  // Scale through a string so 0.925 × 1000 does not become 924.9999…
  const scaled = Number((value * factor).toPrecision(12))
  return Number((round(scaled) / factor).toPrecision(15))
}
