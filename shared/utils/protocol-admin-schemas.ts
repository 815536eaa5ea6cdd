import { z } from 'zod'
import { BUILT_IN_PROTOCOLS, protocolSchema } from './compute'
import type { Protocol } from './compute'

export const MAX_CUSTOM_PROTOCOLS = 20
export const MAX_PROTOCOL_EXERCISES = 30
export const MAX_EXERCISE_SECONDS = 1800

/**
 * A custom protocol as an admin adds it: the computation module's own protocol schema (unique
 * keys and names, whole seconds, sampling that fits, ambient samples where the plan needs them),
 * plus limits of a real test session and a key that no built-in protocol uses.
 */
// Control characters (NUL among them) have no place in a name and cannot be stored.
const CONTROL = { test: (text: string) => [...text].some(c => c.charCodeAt(0) < 32 || c.charCodeAt(0) === 127) }

export const customProtocolSchema = protocolSchema.superRefine((p, ctx) => {
  if (CONTROL.test(p.name)) ctx.addIssue({ code: 'custom', path: ['name'], message: 'Use letters, digits, spaces and punctuation only in the name' })
  if (CONTROL.test(p.source)) ctx.addIssue({ code: 'custom', path: ['source'], message: 'Use letters, digits, spaces and punctuation only in the source' })
  p.exercises.forEach((e, i) => {
    if (CONTROL.test(e.name)) ctx.addIssue({ code: 'custom', path: ['exercises', i, 'name'], message: 'Use letters, digits, spaces and punctuation only in the exercise name' })
  })
  if (BUILT_IN_PROTOCOLS.some(b => b.key === p.key)) {
    ctx.addIssue({ code: 'custom', path: ['key'], message: `'${p.key}' is the key of a built-in protocol; choose another` })
  }
  if (p.exercises.length > MAX_PROTOCOL_EXERCISES) {
    ctx.addIssue({ code: 'custom', path: ['exercises'], message: `A protocol may have at most ${MAX_PROTOCOL_EXERCISES} exercises` })
  }
  p.exercises.forEach((e, i) => {
    if (e.durationSeconds > MAX_EXERCISE_SECONDS) {
      ctx.addIssue({ code: 'custom', path: ['exercises', i, 'durationSeconds'], message: `'${e.name}' lasts more than ${MAX_EXERCISE_SECONDS} s; split it` })
    }
  })
})
export type CustomProtocolInput = z.input<typeof customProtocolSchema>

export const protocolKeyParamSchema = z.object({ key: z.string().min(1).max(80) })

/** A blank exercise row for the protocol form, sampled per exercise. */
export function blankExercise(index: number): Protocol['exercises'][number] {
  return { key: `exercise-${index + 1}`, name: '', durationSeconds: 60, counted: true, sampling: { ambientSeconds: 6, purgeSeconds: 4, maskSeconds: 40, closingAmbientSeconds: 0 } }
}
