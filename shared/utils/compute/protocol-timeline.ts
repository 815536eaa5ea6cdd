import type { Protocol, ProtocolExercise, SamplingPlan } from './protocol-data'

// Timeline: where each exercise and each of its phases starts and ends, in seconds from the
// start of the test. The count-series segmentation and the simulator both use it.

export type PhaseKind = 'purge' | 'ambient' | 'mask' | 'idle'

export interface PhaseWindow {
  kind: PhaseKind
  startSeconds: number
  endSeconds: number
  exerciseIndex: number
}

export interface ExerciseWindow {
  index: number
  exerciseKey: string
  exerciseName: string
  counted: boolean
  startSeconds: number
  endSeconds: number
  phases: PhaseWindow[]
  mask: PhaseWindow | null
  // The ambient samples this exercise's fit factor uses, by the protocol's ambient plan; both
  // null for a continuous plan (the ambient readings taken during the mask phase are used).
  ambientBefore: PhaseWindow | null
  ambientAfter: PhaseWindow | null
}

export interface ProtocolTimeline {
  durationSeconds: number
  exercises: ExerciseWindow[]
  ambientPhases: PhaseWindow[]
}

export function protocolDurationSeconds(protocol: Protocol): number {
  let total = 0
  for (const e of protocol.exercises) total += e.durationSeconds
  return total
}

// Seconds an exercise's sampling plan occupies, by the layout described at SamplingPlan.
export function sampledSeconds(sampling: SamplingPlan): number {
  const { ambientSeconds: a, purgeSeconds: p, maskSeconds: m, closingAmbientSeconds: c } = sampling
  let total = 0
  if (a > 0) total += p + a
  if (m > 0) total += (a > 0 ? p : 0) + m
  if (c > 0) total += p + c
  return total
}

function layoutExercise(exercise: ProtocolExercise, index: number, start: number): PhaseWindow[] {
  const { ambientSeconds: a, purgeSeconds: p, maskSeconds: m, closingAmbientSeconds: c } = exercise.sampling
  const end = start + exercise.durationSeconds
  const phases: PhaseWindow[] = []
  let cursor = start
  const push = (kind: PhaseKind, seconds: number): void => {
    if (seconds <= 0) return
    phases.push({ kind, startSeconds: cursor, endSeconds: cursor + seconds, exerciseIndex: index })
    cursor += seconds
  }
  if (a > 0) {
    push('purge', p)
    push('ambient', a)
  }
  if (m > 0) {
    if (a > 0) push('purge', p)
    push('mask', m)
  }
  const closingStart = c > 0 ? end - p - c : end
  push('idle', closingStart - cursor)
  if (c > 0) {
    push('purge', p)
    push('ambient', c)
  }
  return phases
}

// The timeline of a protocol. Recomputed on every call (a microsecond or so), so a protocol
// being edited in a form never shows a stale timeline.
export function protocolTimeline(protocol: Protocol): ProtocolTimeline {
  const exercises: ExerciseWindow[] = []
  const ambientPhases: PhaseWindow[] = []
  let start = 0
  protocol.exercises.forEach((exercise, index) => {
    const phases = layoutExercise(exercise, index, start)
    for (const ph of phases) if (ph.kind === 'ambient') ambientPhases.push(ph)
    exercises.push({
      index,
      exerciseKey: exercise.key,
      exerciseName: exercise.name,
      counted: exercise.counted,
      startSeconds: start,
      endSeconds: start + exercise.durationSeconds,
      phases,
      mask: phases.find(ph => ph.kind === 'mask') ?? null,
      ambientBefore: null,
      ambientAfter: null
    })
    start += exercise.durationSeconds
  })

  if (protocol.ambientPlan === 'per-exercise') {
    for (const w of exercises) {
      if (!w.mask) continue
      const maskStart = w.mask.startSeconds
      const maskEnd = w.mask.endSeconds
      w.ambientBefore = findLast(ambientPhases, ph => ph.endSeconds <= maskStart)
      w.ambientAfter = ambientPhases.find(ph => ph.startSeconds >= maskEnd) ?? null
    }
  } else if (protocol.ambientPlan === 'whole-test') {
    const first = ambientPhases[0] ?? null
    const last = ambientPhases.length > 1 ? ambientPhases[ambientPhases.length - 1]! : null
    for (const w of exercises) {
      if (!w.mask) continue
      w.ambientBefore = first && first.endSeconds <= w.mask.startSeconds ? first : null
      w.ambientAfter = last && last.startSeconds >= w.mask.endSeconds ? last : null
    }
  }

  return { durationSeconds: start, exercises, ambientPhases }
}

function findLast<T>(items: readonly T[], test: (item: T) => boolean): T | null {
  for (let i = items.length - 1; i >= 0; i--) if (test(items[i]!)) return items[i]!
  return null
}

// Exercise windows in seconds from the start of the test, for a protocol (see protocolTimeline).
export function exerciseWindows(protocol: Protocol): ExerciseWindow[] {
  return protocolTimeline(protocol).exercises
}
