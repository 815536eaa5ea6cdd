import { STANDARD_PROTOCOL } from '../../shared/utils/compute'

/**
 * Grid entries for the standard protocol whose counted exercises have the given fit factors
 * (ambient 10,000 /cm³ before and after; in-mask = ambient / FF). The grimace is left blank.
 */
export function standardEntry(fitFactors: number[]) {
  let i = 0
  return {
    mode: 'grid' as const,
    exercises: STANDARD_PROTOCOL.exercises.filter(e => e.counted).map((e) => {
      const ff = fitFactors[i++]!
      return { exerciseKey: e.key, ambientBefore: 10_000, ambientAfter: 10_000, inMask: 10_000 / ff }
    })
  }
}

export const allPreTestMet = { medicalClearanceCurrent: true, nothingCrossingSeal: true, userSealCheckDone: true, comfortAcceptable: true }
