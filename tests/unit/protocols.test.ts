import { describe, expect, it } from 'vitest'
import {
  BUILT_IN_PROTOCOLS,
  MODIFIED_ELASTOMERIC_PROTOCOL,
  STANDARD_PROTOCOL,
  exerciseWindows,
  protocolSchema,
  protocolTimeline,
  sampledSeconds
} from '#shared/utils/compute'
import type { ProtocolInput } from '#shared/utils/compute'

function custom(overrides: Partial<ProtocolInput> = {}): ProtocolInput {
  return {
    key: 'site-short',
    name: 'Site short protocol',
    ambientPlan: 'per-exercise',
    exercises: [
      { key: 'breathing', name: 'Breathing', durationSeconds: 40, counted: true, sampling: { ambientSeconds: 5, purgeSeconds: 3, maskSeconds: 20 } },
      { key: 'reading-aloud', name: 'Reading aloud', durationSeconds: 40, counted: true, sampling: { ambientSeconds: 5, purgeSeconds: 3, maskSeconds: 15, closingAmbientSeconds: 5 } }
    ],
    ...overrides
  }
}

const messages = (input: unknown): string[] => {
  const r = protocolSchema.safeParse(input)
  return r.success ? [] : r.error.issues.map(i => i.message)
}

describe('built-in protocols', () => {
  it.each(BUILT_IN_PROTOCOLS.map(p => ({ key: p.key, protocol: p })))('$key satisfies the custom-protocol schema', ({ protocol }) => {
    expect(messages(protocol)).toEqual([])
  })

  it('lays out every exercise of the standard protocol without overlap and ends at 435 s', () => {
    const timeline = protocolTimeline(STANDARD_PROTOCOL)
    let cursor = 0
    for (const w of timeline.exercises) {
      expect(w.startSeconds).toBe(cursor)
      for (const ph of w.phases) {
        expect(ph.startSeconds).toBe(cursor)
        cursor = ph.endSeconds
      }
      expect(cursor).toBe(w.endSeconds)
    }
    expect(timeline.durationSeconds).toBe(435)
  })

  it('pairs each standard exercise with the ambient samples either side of its in-mask sample', () => {
    const windows = exerciseWindows(STANDARD_PROTOCOL)
    const talking = windows.find(w => w.exerciseKey === 'talking')!
    const bending = windows.find(w => w.exerciseKey === 'bending-over')!
    expect(talking.ambientBefore!.endSeconds).toBeLessThanOrEqual(talking.mask!.startSeconds)
    // the grimace is not sampled, so the ambient after talking is the one opening bending over
    expect(talking.ambientAfter).toBe(bending.ambientBefore)
    const last = windows.at(-1)!
    expect(last.ambientAfter!.endSeconds).toBe(435)
    expect(windows.find(w => w.exerciseKey === 'grimace')!.mask).toBeNull()
  })

  it('samples ambient only at the start and end of a modified protocol', () => {
    const timeline = protocolTimeline(MODIFIED_ELASTOMERIC_PROTOCOL)
    expect(timeline.ambientPhases).toHaveLength(2)
    expect(timeline.ambientPhases[0]!.exerciseIndex).toBe(0)
    expect(timeline.ambientPhases[1]!.endSeconds).toBe(149)
    for (const w of timeline.exercises) {
      expect(w.ambientBefore).toBe(timeline.ambientPhases[0])
      expect(w.ambientAfter).toBe(timeline.ambientPhases[1])
    }
  })
})

describe('custom protocol schema', () => {
  it('accepts a well-formed protocol and fills defaults', () => {
    const r = protocolSchema.safeParse(custom())
    expect(r.success).toBe(true)
    expect(r.success && r.data.exercises[0]!.sampling.closingAmbientSeconds).toBe(0)
    expect(r.success && r.data.source).toBe('')
  })

  it.each([
    {
      case: 'duplicate key',
      input: custom({ exercises: [custom().exercises[0]!, { ...custom().exercises[1]!, key: 'breathing' }] }),
      message: 'Exercise key \'breathing\' is used twice; keys must be unique'
    },
    {
      case: 'duplicate name',
      input: custom({ exercises: [custom().exercises[0]!, { ...custom().exercises[1]!, name: 'breathing' }] }),
      message: 'Exercise name \'breathing\' is used twice; names must be unique'
    },
    {
      case: 'fractional duration',
      input: custom({ exercises: [{ ...custom().exercises[0]!, durationSeconds: 12.5 }] }),
      message: 'Duration must be a whole number of seconds'
    },
    {
      case: 'zero duration',
      input: custom({ exercises: [{ ...custom().exercises[0]!, durationSeconds: 0 }] }),
      message: 'Duration must be at least 1 second'
    },
    {
      case: 'nothing counted',
      input: custom({ exercises: custom().exercises.map(e => ({ ...e, counted: false })) }),
      message: 'At least one exercise must count towards the overall fit factor'
    },
    {
      case: 'negative seconds',
      input: custom({ exercises: [{ ...custom().exercises[0]!, sampling: { ambientSeconds: -1, purgeSeconds: 0, maskSeconds: 10 } }] }),
      message: 'Ambient seconds cannot be negative'
    },
    {
      case: 'sampling longer than the exercise',
      input: custom({ exercises: [{ ...custom().exercises[0]!, sampling: { ambientSeconds: 10, purgeSeconds: 5, maskSeconds: 25 } }] }),
      message: 'Sampling for \'Breathing\' needs 45 s (purges included) but the exercise lasts 40 s'
    },
    {
      case: 'counted without in-mask seconds',
      input: custom({ exercises: [{ ...custom().exercises[0]!, sampling: { ambientSeconds: 5, purgeSeconds: 3, maskSeconds: 0 } }] }),
      message: '\'Breathing\' is counted, so it needs in-mask seconds'
    },
    {
      case: 'no ambient after the last exercise',
      input: custom({ exercises: [custom().exercises[0]!, { ...custom().exercises[1]!, sampling: { ambientSeconds: 5, purgeSeconds: 3, maskSeconds: 15 } }] }),
      message: '\'Reading aloud\' has no ambient sample after its in-mask sample; give a later exercise ambient seconds or this one closing ambient seconds'
    },
    {
      case: 'whole-test plan without a closing ambient',
      input: custom({ ambientPlan: 'whole-test', exercises: [custom().exercises[0]!, { ...custom().exercises[1]!, sampling: { ambientSeconds: 0, purgeSeconds: 3, maskSeconds: 15 } }] }),
      message: 'The test needs an ambient sample at the end; give the last exercise closing ambient seconds'
    },
    {
      case: 'bad key',
      input: custom({ key: 'Site Short' }),
      message: 'Protocol key may use lowercase letters, digits and hyphens, starting with a letter or digit'
    },
    {
      case: 'no exercises',
      input: custom({ exercises: [] }),
      message: 'A protocol needs at least one exercise'
    }
  ])('refuses $case with a clear message', ({ input, message }) => {
    expect(messages(input)).toContain(message)
  })

  it('counts purges only around the samples they flush', () => {
    expect(sampledSeconds({ ambientSeconds: 0, purgeSeconds: 4, maskSeconds: 30, closingAmbientSeconds: 0 })).toBe(30)
    expect(sampledSeconds({ ambientSeconds: 6, purgeSeconds: 4, maskSeconds: 36, closingAmbientSeconds: 0 })).toBe(50)
    expect(sampledSeconds({ ambientSeconds: 0, purgeSeconds: 4, maskSeconds: 29, closingAmbientSeconds: 6 })).toBe(39)
  })
})
