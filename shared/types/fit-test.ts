// The shapes the fit-test computation takes and gives (computeFitTest in
// shared/utils/compute/fit-test.ts). Concentrations in particles/cm³, flows in cm³/min.
import type { ComputeIssue } from '../utils/compute/errors'
import type { FitFactorValue } from '../utils/compute/fit-factor'
import type { Protocol } from '../utils/compute/protocol-data'

// One exercise as entered or as derived from a count series. Concentrations in particles/cm³.
export interface ExerciseInput {
  exerciseKey: string
  // per-exercise ambient plan: the samples before and after the exercise
  ambientBefore?: number | null
  ambientAfter?: number | null
  // continuous ambient plan: the mean ambient during the exercise
  ambientMean?: number | null
  // mean in-mask concentration; may be left out when inMaskCount and the sample volume are known
  inMask?: number | null
  // particles counted during the in-mask sample, when the counter reports it
  inMaskCount?: number | null
  // seconds of in-mask sample; defaults to the protocol's maskSeconds for the exercise
  inMaskSeconds?: number | null
}

// whole-test ambient plan: the samples at the start and end of the test
export interface WholeTestAmbient {
  start?: number | null
  end?: number | null
}

export interface FitTestInput {
  protocol: Protocol
  exercises: readonly ExerciseInput[]
  passLevel: number
  sampleFlowCm3PerMin?: number | null
  wholeTestAmbient?: WholeTestAmbient | null
  confidence?: number
  // Poisson intervals per exercise; true by default. Bulk recomputation may turn them off.
  intervals?: boolean
}

// 95 % (or `confidence`) interval of an exercise fit factor from counting statistics alone.
// Method: the in-mask count N is Poisson; the ambient concentration is treated as precise
// (its count is typically hundreds of times larger). With V the in-mask sample volume,
// FF = ambient·V / N, so the interval is ambient·V / (Garwood upper, Garwood lower) of N.
// When the counter reported no count, N is estimated as inMask·V. upper is null when N = 0.
// Bounds come from poissonInterval's 'fast' method (exact Garwood up to N = 1000).
export interface FitFactorInterval {
  lower: number
  upper: number | null
  confidence: number
  inMaskCount: number
  countEstimated: boolean
}

export interface ExerciseResult {
  exerciseKey: string
  exerciseName: string
  counted: boolean
  ambient: number | null
  inMask: number | null
  sampleVolumeCm3: number | null
  fitFactor: FitFactorValue | null
  interval: FitFactorInterval | null
  // (1/ffᵢ) / Σ(1/ff) over the counted exercises; null for an exercise that is not counted
  penetrationShare: number | null
  limiting: boolean
}

export interface LimitingExercise {
  exerciseKey: string
  exerciseName: string
  fitFactor: FitFactorValue
  penetrationShare: number
}

export interface FitTestCommon {
  protocolKey: string
  exercises: ExerciseResult[]
  issues: ComputeIssue[]
  cautions: readonly string[]
}

export interface FitTestSuccess extends FitTestCommon {
  ok: true
  overall: FitFactorValue
  overallText: string
  limiting: LimitingExercise
  passLevel: number
  pass: boolean
}

export interface FitTestFailure extends FitTestCommon {
  ok: false
  overall: null
  overallText: null
  limiting: null
  passLevel: number | null
  pass: null
}

export type FitTestResult = FitTestSuccess | FitTestFailure
