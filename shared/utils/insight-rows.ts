// The per-exercise rows insights keep for a finished quantitative revision, derived from the same
// recomputation as its stored overall. Pure, so the server, the demo seed and the benchmark share it.
import { canonicalMovement } from './compute'
import type { FitTestResult } from './compute'

export interface ExerciseInsightRow {
  fitTestId: string
  organizationId: string
  exerciseKey: string
  movement: string
  fitFactor: number
  isLowerBound: boolean
  penetrationShare: number
  isLimiting: boolean
}

export function exerciseInsightRows(organizationId: string, fitTestId: string, result: FitTestResult): ExerciseInsightRow[] {
  if (!result.ok) return []
  return result.exercises
    .filter(e => e.counted && e.fitFactor)
    .map(e => ({
      fitTestId,
      organizationId,
      exerciseKey: e.exerciseKey,
      movement: canonicalMovement(e.exerciseKey),
      fitFactor: e.fitFactor!.value,
      isLowerBound: e.fitFactor!.isLowerBound,
      penetrationShare: e.penetrationShare ?? 0,
      isLimiting: e.limiting
    }))
}
