import { sampleVolumeCm3 } from './counting-stats'
import { harmonicMeanFitFactor } from './fit-factor'
import type { ExerciseInput, FitTestResult } from './fit-test'
import { computeFitTest } from './fit-test'
import type { PhaseWindow } from './protocols'
import { protocolTimeline } from './protocols'
import type { SimulationInput } from './simulation-core'
import { mulberry32, samplePoisson, trueFactorFor, validate } from './simulation-core'

// ── A second-by-second trace, for watching one simulated test run ─────────────────────────────

export interface TraceSecond {
  t: number
  exerciseIndex: number
  phase: 'purge' | 'ambient' | 'mask' | 'idle'
  // particles counted in this second (null while purging or idle: nothing is sampled)
  count: number | null
  // count ÷ the volume sampled in the second, particles/cm³
  concentration: number | null
}

export interface SimulatedTrace {
  seconds: TraceSecond[]
  result: FitTestResult
  trueOverall: number
  // each exercise's fit factor can be shown once the trace passes this second
  exerciseReadyAt: Record<string, number>
}

// One simulated test second by second: every sampled second is a Poisson count, and the
// exercise inputs are the sums of those seconds, so the result is exactly what the trace shows.
// The result goes through computeFitTest like a recorded test.
export function simulateCountTrace(input: SimulationInput): SimulatedTrace {
  validate(input)
  const { protocol } = input
  const random = mulberry32(input.seed)
  const timeline = protocolTimeline(protocol)
  const perSecondVolume = sampleVolumeCm3(input.sampleFlowCm3PerMin, 1)
  const seconds: TraceSecond[] = []
  const phaseCounts = new Map<PhaseWindow, number>()
  const truth: number[] = []
  for (const w of timeline.exercises) {
    const trueFitFactor = w.counted && w.mask ? trueFactorFor(input, w.exerciseKey) : null
    if (trueFitFactor !== null) truth.push(trueFitFactor)
    for (const ph of w.phases) {
      let total = 0
      for (let t = ph.startSeconds; t < ph.endSeconds; t++) {
        let count: number | null = null
        if (ph.kind === 'ambient') count = samplePoisson(input.ambient * perSecondVolume, random)
        // an exercise that is not counted is performed without a sample
        if (ph.kind === 'mask' && trueFitFactor !== null) count = samplePoisson(input.ambient * perSecondVolume / trueFitFactor, random)
        if (count !== null) total += count
        seconds.push({ t, exerciseIndex: w.index, phase: ph.kind, count, concentration: count === null ? null : count / perSecondVolume })
      }
      phaseCounts.set(ph, total)
    }
  }
  const concentrationOf = (ph: PhaseWindow | null) => ph ? phaseCounts.get(ph)! / sampleVolumeCm3(input.sampleFlowCm3PerMin, ph.endSeconds - ph.startSeconds) : null
  const exercises: ExerciseInput[] = []
  const exerciseReadyAt: Record<string, number> = {}
  let wholeStart: number | null = null
  let wholeEnd: number | null = null
  for (const w of timeline.exercises) {
    if (!w.counted || !w.mask) continue
    const entry: ExerciseInput = { exerciseKey: w.exerciseKey, inMaskCount: phaseCounts.get(w.mask)!, inMaskSeconds: w.mask.endSeconds - w.mask.startSeconds }
    if (protocol.ambientPlan === 'per-exercise') {
      entry.ambientBefore = concentrationOf(w.ambientBefore)
      entry.ambientAfter = concentrationOf(w.ambientAfter)
    } else if (protocol.ambientPlan === 'continuous') {
      entry.ambientMean = input.ambient
    } else {
      wholeStart = concentrationOf(w.ambientBefore)
      wholeEnd = concentrationOf(w.ambientAfter)
    }
    exercises.push(entry)
    exerciseReadyAt[w.exerciseKey] = protocol.ambientPlan === 'per-exercise'
      ? (w.ambientAfter?.endSeconds ?? w.mask.endSeconds)
      : protocol.ambientPlan === 'whole-test' ? timeline.durationSeconds : w.mask.endSeconds
  }
  const result = computeFitTest({
    protocol,
    exercises,
    wholeTestAmbient: { start: wholeStart, end: wholeEnd },
    passLevel: input.passLevel,
    sampleFlowCm3PerMin: input.sampleFlowCm3PerMin
  })
  return { seconds, result, trueOverall: harmonicMeanFitFactor(truth), exerciseReadyAt }
}
