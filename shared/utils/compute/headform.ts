import { HEADFORM_CAUTIONS } from './cautions'
import { DEFAULT_CONFIDENCE, poissonInterval, sampleVolumeCm3 } from './counting-stats'
import type { ComputeIssue } from './errors'
import { checkNonNegative, checkPositive, errorIssue, hasErrors } from './errors'
import type { AcceptanceRule } from './acceptance'
import { evaluateAcceptanceRule } from './acceptance'
import type { FitFactorValue } from './fit-factor'
import { formatFitFactor, meetsPassLevel, zeroCountFitFactorBound } from './fit-factor'
import type { FitFactorInterval } from './fit-test'
import { SOURCE_FROM_MEMORY } from './sources'

// Headform test of a mask unit on the bench rig: aerosol outside the mask (in the hood) against
// aerosol inside it, over one bench sample.

export interface BenchSampleInput {
  outside: number | null | undefined
  inside: number | null | undefined
  insideCount?: number | null
  sampleSeconds?: number | null
  sampleFlowCm3PerMin?: number | null
}

export interface BenchProtectionFactor {
  factor: FitFactorValue | null
  interval: FitFactorInterval | null
  text: string | null
}

// Bench protection factor = outside / inside over the bench sample (same ratio as a fit factor,
// DOMAIN "Bench protection factor"). A zero inside reading with a known sample volume gives a
// lower bound (one-sided Poisson, like a fit factor); the interval follows the same method as
// FitFactorInterval (outside treated as precise).
export function benchProtectionFactor(
  input: BenchSampleInput,
  confidence = DEFAULT_CONFIDENCE
): { value: BenchProtectionFactor, issues: ComputeIssue[] } {
  const issues: ComputeIssue[] = []
  const none: BenchProtectionFactor = { factor: null, interval: null, text: null }
  const outside = checkPositive(input.outside, 'Outside concentration', { field: 'outside' })
  const inside = checkNonNegative(input.inside, 'Inside concentration', { field: 'inside' })
  if (!outside.ok) issues.push(outside.issue)
  if (!inside.ok) issues.push(inside.issue)

  let volume: number | null = null
  const hasFlow = input.sampleFlowCm3PerMin !== undefined && input.sampleFlowCm3PerMin !== null
  const hasSeconds = input.sampleSeconds !== undefined && input.sampleSeconds !== null
  if (hasFlow || hasSeconds) {
    const f = checkPositive(input.sampleFlowCm3PerMin, 'Sample flow (cm³/min)', { field: 'sampleFlowCm3PerMin' })
    const s = checkPositive(input.sampleSeconds, 'Bench sample seconds', { field: 'sampleSeconds' })
    if (!f.ok) issues.push(f.issue)
    if (!s.ok) issues.push(s.issue)
    if (f.ok && s.ok) volume = sampleVolumeCm3(f.value, s.value)
  }
  let count: number | null = null
  if (input.insideCount !== undefined && input.insideCount !== null) {
    const c = checkNonNegative(input.insideCount, 'Inside count', { field: 'insideCount' })
    if (!c.ok) issues.push(c.issue)
    else if (!Number.isInteger(c.value)) issues.push(errorIssue('not-a-number', 'Inside count must be a whole number of particles', { field: 'insideCount' }))
    else count = c.value
  }
  if (!outside.ok || !inside.ok || hasErrors(issues)) return { value: none, issues }

  if (inside.value === 0) {
    if (volume === null) {
      issues.push(errorIssue('zero-without-volume', 'Inside concentration is zero; enter the sample flow and seconds so a lower bound can be given', { field: 'inside' }))
      return { value: none, issues }
    }
    const factor = zeroCountFitFactorBound(outside.value, volume, confidence)
    return {
      value: { factor, text: formatFitFactor(factor), interval: { lower: factor.value, upper: null, confidence, inMaskCount: 0, countEstimated: count === null } },
      issues
    }
  }
  const factor: FitFactorValue = { value: outside.value / inside.value, isLowerBound: false }
  let interval: FitFactorInterval | null = null
  if (volume !== null) {
    const n = count ?? inside.value * volume
    const g = poissonInterval(n, confidence, 'fast')
    interval = {
      lower: (outside.value * volume) / g.upper,
      upper: g.lower > 0 ? (outside.value * volume) / g.lower : null,
      confidence,
      inMaskCount: n,
      countEstimated: count === null
    }
  }
  return { value: { factor, interval, text: formatFitFactor(factor) }, issues }
}

// There is no public pass level for a headform test; a program sets one per mask type. This is
// the default offered, labelled with where it comes from.
export const HEADFORM_DEFAULT_PASS_LEVEL = {
  value: 2000,
  label: `NIOSH CBRN laboratory protection level (${SOURCE_FROM_MEMORY})`,
  source: SOURCE_FROM_MEMORY
} as const

export interface HeadformPassLevel {
  level: number
  label: string
  isDefault: boolean
}

// The pass level for a mask type from the program's settings, or the labelled default.
export function resolveHeadformPassLevel(
  settings: Readonly<Record<string, number>> | null | undefined,
  maskTypeKey: string
): HeadformPassLevel {
  const configured = settings?.[maskTypeKey]
  if (typeof configured === 'number' && Number.isFinite(configured) && configured > 0) {
    return { level: configured, label: 'Program setting', isDefault: false }
  }
  return { level: HEADFORM_DEFAULT_PASS_LEVEL.value, label: HEADFORM_DEFAULT_PASS_LEVEL.label, isDefault: true }
}

export interface SubCheckInput {
  key: string
  label: string
  rule: AcceptanceRule
  value: number | boolean | null | undefined
}

export interface SubCheckResult {
  key: string
  label: string
  passed: boolean | null
  message: string | null
}

export interface HeadformTestInput {
  bench: BenchSampleInput
  passLevel: number
  subChecks?: readonly SubCheckInput[]
  confidence?: number
}

export interface HeadformTestResult {
  ok: boolean
  benchProtectionFactor: BenchProtectionFactor
  passLevel: number | null
  // the bench protection factor reaches the pass level (≥)
  factorPassed: boolean | null
  subChecks: SubCheckResult[]
  // every sub-check passed and the factor reached the level; null while something is missing
  passed: boolean | null
  issues: ComputeIssue[]
  cautions: readonly string[]
}

// A whole headform test: bench protection factor against its pass level, plus sub-checks
// (exhalation valve, straps, …) each against its acceptance rule.
export function computeHeadformTest(input: HeadformTestInput): HeadformTestResult {
  const issues: ComputeIssue[] = []
  const bench = benchProtectionFactor(input.bench, input.confidence)
  issues.push(...bench.issues)
  const level = checkPositive(input.passLevel, 'Pass level', { field: 'passLevel' })
  if (!level.ok) issues.push(level.issue)

  const factor = bench.value.factor
  let factorPassed: boolean | null = null
  if (factor && level.ok) {
    factorPassed = meetsPassLevel(factor.value, level.value)
  }

  const subChecks: SubCheckResult[] = (input.subChecks ?? []).map((check) => {
    const verdict = evaluateAcceptanceRule(check.rule, check.value, check.label)
    if (!verdict.ok) {
      issues.push(...verdict.issues.map(i => ({ ...i, field: `subChecks.${check.key}` })))
      return { key: check.key, label: check.label, passed: null, message: null }
    }
    return { key: check.key, label: check.label, passed: verdict.value.passed, message: verdict.value.message }
  })

  const ok = !hasErrors(issues)
  const anyFailed = factorPassed === false || subChecks.some(c => c.passed === false)
  const passed = anyFailed ? false : ok && factorPassed === true ? true : null
  return {
    ok,
    benchProtectionFactor: bench.value,
    passLevel: level.ok ? level.value : null,
    factorPassed,
    subChecks,
    passed,
    issues,
    cautions: HEADFORM_CAUTIONS
  }
}
