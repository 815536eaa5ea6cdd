import { expectedCount, sampleVolumeCm3 } from './counting-stats'
import type { Protocol } from './protocols'
import { protocolDurationSeconds } from './protocols'
import type { RuleOfThumb } from './sources'
import { SOURCE_COMMON_PRACTICE, SOURCE_FROM_MEMORY } from './sources'

// How long a test must sample to resolve a fit factor, from counting statistics alone.
// Concentrations particles/cm³, flows cm³/min (converted to cm³/s inside), times seconds.

export interface CountingConditions {
  ambient: number
  flowCm3PerMin: number
}

function assertPositive(value: number, name: string): void {
  if (!(value > 0) || !Number.isFinite(value)) throw new RangeError(`${name} must be a positive number`)
}

// In-mask count expected in t seconds at fit factor FF: N_in = C_amb·Q·t / FF.
// Derived from FF = C_amb / C_in and N = C·Q·t (DOMAIN counting statistics).
export function expectedInMaskCount(conditions: CountingConditions, fitFactor: number, seconds: number): number {
  assertPositive(fitFactor, 'fit factor')
  return expectedCount(conditions.ambient, conditions.flowCm3PerMin, seconds) / fitFactor
}

// In-mask sample seconds needed to resolve FF at relative precision r (r = 1/√N_in):
// t = FF / (C_amb·Q·r²). Derived from N_in = C_amb·Q·t / FF and RSD = 1/√N.
export function sampleSecondsForFitFactor(conditions: CountingConditions, fitFactor: number, relativePrecision: number): number {
  assertPositive(conditions.ambient, 'ambient concentration')
  assertPositive(conditions.flowCm3PerMin, 'sample flow')
  assertPositive(fitFactor, 'fit factor')
  assertPositive(relativePrecision, 'relative precision')
  return fitFactor / (conditions.ambient * sampleVolumeCm3(conditions.flowCm3PerMin, 1) * relativePrecision ** 2)
}

// Largest fit factor resolvable at relative precision r in t seconds: FF = C_amb·Q·t·r².
// Derived from the same relation, solved for FF.
export function largestResolvableFitFactor(conditions: CountingConditions, seconds: number, relativePrecision: number): number {
  assertPositive(conditions.ambient, 'ambient concentration')
  assertPositive(conditions.flowCm3PerMin, 'sample flow')
  assertPositive(seconds, 'seconds')
  assertPositive(relativePrecision, 'relative precision')
  return expectedCount(conditions.ambient, conditions.flowCm3PerMin, seconds) * relativePrecision ** 2
}

// How many times longer a test runs at flow `slowerFlow` than at `fasterFlow` for the same
// precision (t ∝ 1/Q). Derived from t = FF / (C·Q·r²).
export function testLengthRatio(fasterFlowCm3PerMin: number, slowerFlowCm3PerMin: number): number {
  assertPositive(fasterFlowCm3PerMin, 'flow')
  assertPositive(slowerFlowCm3PerMin, 'flow')
  return fasterFlowCm3PerMin / slowerFlowCm3PerMin
}

export interface ProtocolLength {
  protocolKey: string
  protocolName: string
  durationSeconds: number
  countedExercises: number
  // seconds of in-mask sample of the shortest counted exercise: it limits the resolvable FF
  shortestMaskSeconds: number
}

export function protocolLength(protocol: Protocol): ProtocolLength {
  const counted = protocol.exercises.filter(e => e.counted)
  return {
    protocolKey: protocol.key,
    protocolName: protocol.name,
    durationSeconds: protocolDurationSeconds(protocol),
    countedExercises: counted.length,
    shortestMaskSeconds: counted.length ? Math.min(...counted.map(e => e.sampling.maskSeconds)) : 0
  }
}

// Rules of thumb the training lab and the headform page offer. Starting points, not limits.
export const HEADFORM_AEROSOL_MIN_CM3: RuleOfThumb = {
  value: 25000,
  unit: 'particles/cm³',
  label: 'Aerosol concentration in the hood before a headform test starts',
  source: SOURCE_COMMON_PRACTICE
}

export const CURRENT_COUNTER_FLOW_CM3_PER_MIN: RuleOfThumb = {
  value: 350,
  unit: 'cm³/min',
  label: 'Sample flow of a current counter',
  source: SOURCE_COMMON_PRACTICE
}

export const OLDER_COUNTER_FLOW_CM3_PER_MIN: RuleOfThumb = {
  value: 100,
  unit: 'cm³/min',
  label: 'Sample flow of an older counter',
  source: SOURCE_FROM_MEMORY
}

export const OLDER_COUNTER_SLOWDOWN: RuleOfThumb = {
  value: 3.5,
  unit: '×',
  label: 'How much longer the same test runs on an older counter',
  source: `${SOURCE_FROM_MEMORY} (350 / 100 cm³/min)`
}

export const RULES_OF_THUMB: readonly RuleOfThumb[] = [
  HEADFORM_AEROSOL_MIN_CM3,
  CURRENT_COUNTER_FLOW_CM3_PER_MIN,
  OLDER_COUNTER_FLOW_CM3_PER_MIN,
  OLDER_COUNTER_SLOWDOWN
]
