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
