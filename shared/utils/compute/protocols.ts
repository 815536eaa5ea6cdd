import { z } from 'zod'

// Protocols are data, not code: the built-in ones below and any custom one an admin adds go
// through the same timeline and the same computation.

// How the ambient concentration of each exercise is obtained (29 CFR 1910.134 App. A,
// Part I.C.2(c), from memory): mean of the samples before and after the exercise, mean of the
// samples at the start and end of the whole test, or mean of a continuous ambient sample.
export const AMBIENT_PLANS = ['per-exercise', 'whole-test', 'continuous'] as const
export type AmbientPlan = typeof AMBIENT_PLANS[number]

export const AMBIENT_PLAN_LABELS: Readonly<Record<AmbientPlan, string>> = {
  'per-exercise': 'Ambient before and after each exercise',
  'whole-test': 'Ambient at the start and end of the test',
  'continuous': 'Ambient sampled continuously'
}

// How one exercise's seconds are spent by the counter. Laid out from the exercise's start:
//   [purge, ambient]            when ambientSeconds > 0 (the opening ambient sample)
//   [purge,] mask               the purge only after an opening ambient sample
//   idle                        whatever is left (performed, not sampled)
//   [purge, closing ambient]    when closingAmbientSeconds > 0, aligned to the exercise's end
// A purge is the time the sample line needs to flush after switching between ambient and mask;
// readings taken during a purge or idle time are not used.
export interface SamplingPlan {
  ambientSeconds: number
  purgeSeconds: number
  maskSeconds: number
  closingAmbientSeconds: number
}

export interface ProtocolExercise {
  key: string
  name: string
  durationSeconds: number
  // Performed by the wearer but left out of the overall fit factor when false.
  counted: boolean
  sampling: SamplingPlan
}

export interface Protocol {
  key: string
  name: string
  source: string
  ambientPlan: AmbientPlan
  exercises: readonly ProtocolExercise[]
}

// The split of each exercise into purge / ambient / mask seconds is from memory: the
// regulation gives the exercises and their durations, not this split. It is kept as data so it
// can be corrected without touching any formula.
const PURGE = 4
const AMBIENT = 6

function plan(ambientSeconds: number, maskSeconds: number, closingAmbientSeconds = 0): SamplingPlan {
  return { ambientSeconds, purgeSeconds: PURGE, maskSeconds, closingAmbientSeconds }
}

const NOT_SAMPLED: SamplingPlan = { ambientSeconds: 0, purgeSeconds: 0, maskSeconds: 0, closingAmbientSeconds: 0 }

// 29 CFR 1910.134 App. A, Part I.A.14: eight exercises; the grimace is performed but not
// counted (74 FR 3526, 2009, footnote 1); 435 s in all.
export const STANDARD_PROTOCOL: Protocol = {
  key: 'osha-standard',
  name: 'Standard protocol',
  source: '29 CFR 1910.134 App. A, Part I.A.14',
  ambientPlan: 'per-exercise',
  exercises: [
    { key: 'normal-breathing-start', name: 'Normal breathing (start)', durationSeconds: 60, counted: true, sampling: plan(AMBIENT, 46) },
    { key: 'deep-breathing', name: 'Deep breathing', durationSeconds: 60, counted: true, sampling: plan(AMBIENT, 46) },
    { key: 'head-side-to-side', name: 'Turning head side to side', durationSeconds: 60, counted: true, sampling: plan(AMBIENT, 46) },
    { key: 'head-up-and-down', name: 'Moving head up and down', durationSeconds: 60, counted: true, sampling: plan(AMBIENT, 46) },
    { key: 'talking', name: 'Talking', durationSeconds: 60, counted: true, sampling: plan(AMBIENT, 46) },
    { key: 'grimace', name: 'Grimace', durationSeconds: 15, counted: false, sampling: NOT_SAMPLED },
    { key: 'bending-over', name: 'Bending over', durationSeconds: 60, counted: true, sampling: plan(AMBIENT, 46) },
    { key: 'normal-breathing-end', name: 'Normal breathing (end)', durationSeconds: 60, counted: true, sampling: plan(AMBIENT, 36, AMBIENT) }
  ]
}

// 29 CFR 1910.134 App. A, Part I.C.4 (84 FR 50739, 2019): elastomeric half and full facepieces,
// four exercises, ambient only at the start and end, 149 s in all.
export const MODIFIED_ELASTOMERIC_PROTOCOL: Protocol = {
  key: 'osha-modified-elastomeric',
  name: 'Modified protocol, elastomeric half and full facepiece',
  source: '29 CFR 1910.134 App. A, Part I.C.4 (84 FR 50739, 2019)',
  ambientPlan: 'whole-test',
  exercises: [
    { key: 'bending', name: 'Bending', durationSeconds: 50, counted: true, sampling: plan(AMBIENT, 36) },
    { key: 'jogging-in-place', name: 'Jogging in place', durationSeconds: 30, counted: true, sampling: plan(0, 30) },
    { key: 'head-side-to-side', name: 'Head side to side', durationSeconds: 30, counted: true, sampling: plan(0, 30) },
    { key: 'head-up-and-down', name: 'Head up and down', durationSeconds: 39, counted: true, sampling: plan(0, 29, AMBIENT) }
  ]
}

// 29 CFR 1910.134 App. A, Part I.C.5 (84 FR 50739, 2019): filtering facepieces, four exercises,
// ambient only at the start and end, 149 s in all.
export const MODIFIED_FILTERING_FACEPIECE_PROTOCOL: Protocol = {
  key: 'osha-modified-filtering-facepiece',
  name: 'Modified protocol, filtering facepiece',
  source: '29 CFR 1910.134 App. A, Part I.C.5 (84 FR 50739, 2019)',
  ambientPlan: 'whole-test',
  exercises: [
    { key: 'bending', name: 'Bending', durationSeconds: 50, counted: true, sampling: plan(AMBIENT, 36) },
    { key: 'talking', name: 'Talking', durationSeconds: 30, counted: true, sampling: plan(0, 30) },
    { key: 'head-side-to-side', name: 'Head side to side', durationSeconds: 30, counted: true, sampling: plan(0, 30) },
    { key: 'head-up-and-down', name: 'Head up and down', durationSeconds: 39, counted: true, sampling: plan(0, 29, AMBIENT) }
  ]
}

export const BUILT_IN_PROTOCOLS: readonly Protocol[] = [
  STANDARD_PROTOCOL,
  MODIFIED_ELASTOMERIC_PROTOCOL,
  MODIFIED_FILTERING_FACEPIECE_PROTOCOL
]

export function findBuiltInProtocol(key: string): Protocol | undefined {
  return BUILT_IN_PROTOCOLS.find(p => p.key === key)
}

// ---------------------------------------------------------------------------------------------
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

// ---------------------------------------------------------------------------------------------
// Schema for a custom protocol an admin adds. The built-in protocols satisfy it too.

const KEY_PATTERN = /^[a-z0-9][a-z0-9-]*$/

const secondsField = (label: string) =>
  z.number({ error: `${label} must be a number of seconds` })
    .nonnegative({ error: `${label} cannot be negative` })

export const samplingPlanSchema = z.object({
  ambientSeconds: secondsField('Ambient seconds'),
  purgeSeconds: secondsField('Purge seconds'),
  maskSeconds: secondsField('In-mask seconds'),
  closingAmbientSeconds: secondsField('Closing ambient seconds').default(0)
})

export const protocolExerciseSchema = z.object({
  key: z.string({ error: 'Exercise key is required' })
    .regex(KEY_PATTERN, { error: 'Exercise key may use lowercase letters, digits and hyphens, starting with a letter or digit' }),
  name: z.string({ error: 'Exercise name is required' }).trim()
    .min(1, { error: 'Exercise name is required' })
    .max(80, { error: 'Exercise name must be at most 80 characters' }),
  durationSeconds: z.number({ error: 'Duration must be a whole number of seconds' })
    .int({ error: 'Duration must be a whole number of seconds' })
    .positive({ error: 'Duration must be at least 1 second' }),
  counted: z.boolean({ error: 'Say whether the exercise counts towards the overall fit factor' }),
  sampling: samplingPlanSchema
}).superRefine((e, ctx) => {
  const needed = sampledSeconds(e.sampling)
  if (needed > e.durationSeconds) {
    ctx.addIssue({
      code: 'custom',
      path: ['sampling'],
      message: `Sampling for '${e.name}' needs ${needed} s (purges included) but the exercise lasts ${e.durationSeconds} s`
    })
  }
  if (e.counted && !(e.sampling.maskSeconds > 0)) {
    ctx.addIssue({ code: 'custom', path: ['sampling', 'maskSeconds'], message: `'${e.name}' is counted, so it needs in-mask seconds` })
  }
})

const exerciseListSchema = z.array(protocolExerciseSchema, { error: 'A protocol needs a list of exercises' })
  .min(1, { error: 'A protocol needs at least one exercise' })
  .superRefine((exercises, ctx) => {
    const keys = new Set<string>()
    const names = new Set<string>()
    exercises.forEach((e, i) => {
      if (keys.has(e.key)) {
        ctx.addIssue({ code: 'custom', path: [i, 'key'], message: `Exercise key '${e.key}' is used twice; keys must be unique` })
      }
      keys.add(e.key)
      const folded = e.name.toLowerCase()
      if (names.has(folded)) {
        ctx.addIssue({ code: 'custom', path: [i, 'name'], message: `Exercise name '${e.name}' is used twice; names must be unique` })
      }
      names.add(folded)
    })
    if (!exercises.some(e => e.counted)) {
      ctx.addIssue({ code: 'custom', path: [], message: 'At least one exercise must count towards the overall fit factor' })
    }
  })

export const protocolSchema = z.object({
  key: z.string({ error: 'Protocol key is required' })
    .regex(KEY_PATTERN, { error: 'Protocol key may use lowercase letters, digits and hyphens, starting with a letter or digit' }),
  name: z.string({ error: 'Protocol name is required' }).trim()
    .min(1, { error: 'Protocol name is required' })
    .max(120, { error: 'Protocol name must be at most 120 characters' }),
  source: z.string().trim().max(300, { error: 'Source must be at most 300 characters' }).default(''),
  ambientPlan: z.enum(AMBIENT_PLANS, { error: 'Choose how ambient is sampled: per exercise, whole test or continuous' }),
  exercises: exerciseListSchema
}).superRefine((protocol, ctx) => {
  // Whether each counted exercise has its ambient samples depends on the whole timeline.
  if (protocol.ambientPlan === 'continuous') return
  const timeline = protocolTimeline(protocol)
  const wholeTest = protocol.ambientPlan === 'whole-test'
  let reportedStart = false
  let reportedEnd = false
  timeline.exercises.forEach((w, i) => {
    if (!w.counted || !w.mask) return
    if (!w.ambientBefore && !(wholeTest && reportedStart)) {
      reportedStart = true
      ctx.addIssue({
        code: 'custom',
        path: ['exercises', i, 'sampling', 'ambientSeconds'],
        message: protocol.ambientPlan === 'per-exercise'
          ? `'${w.exerciseName}' has no ambient sample before its in-mask sample; give it ambient seconds`
          : 'The test needs an ambient sample at the start; give the first exercise ambient seconds'
      })
    }
    if (!w.ambientAfter && !(wholeTest && reportedEnd)) {
      reportedEnd = true
      ctx.addIssue({
        code: 'custom',
        path: ['exercises', i, 'sampling', 'closingAmbientSeconds'],
        message: protocol.ambientPlan === 'per-exercise'
          ? `'${w.exerciseName}' has no ambient sample after its in-mask sample; give a later exercise ambient seconds or this one closing ambient seconds`
          : 'The test needs an ambient sample at the end; give the last exercise closing ambient seconds'
      })
    }
  })
})

export type ProtocolInput = z.input<typeof protocolSchema>

// Exercise windows in seconds from the start of the test, for a protocol (see protocolTimeline).
export function exerciseWindows(protocol: Protocol): ExerciseWindow[] {
  return protocolTimeline(protocol).exercises
}
