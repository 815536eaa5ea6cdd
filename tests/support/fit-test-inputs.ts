import { protocolTimeline, STANDARD_PROTOCOL } from '../../shared/utils/compute'

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

/**
 * A 1 Hz count series (our long layout) for a protocol: every ambient phase reads `ambient`,
 * every in-mask phase reads ambient / FF, purges read a value that must be ignored.
 */
export function syntheticSeries(protocol: import('../../shared/utils/compute').Protocol, ambient: number, fitFactor: number) {
  const lines = ['t,channel,conc']
  const timeline = protocolTimeline(protocol)
  for (let t = 0; t < timeline.durationSeconds; t++) {
    const phase = timeline.exercises.flatMap(e => e.phases).find(p => t >= p.startSeconds && t < p.endSeconds)
    if (phase?.kind === 'ambient') lines.push(`${t},ambient,${ambient}`)
    else if (phase?.kind === 'mask') lines.push(`${t},mask,${ambient / fitFactor}`)
    else lines.push(`${t},mask,${ambient / 3}`)
  }
  return `${lines.join('\n')}\n`
}
