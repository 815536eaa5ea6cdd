import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  MODIFIED_ELASTOMERIC_PROTOCOL,
  STANDARD_PROTOCOL,
  computeFitTest,
  harmonicMeanFitFactor,
  parseCountSeries,
  protocolTimeline,
  readCountSeries
} from '#shared/utils/compute'
import type { ExerciseInput, Protocol } from '#shared/utils/compute'

const COUNTED = STANDARD_PROTOCOL.exercises.filter(e => e.counted)
const fitFactor = fc.double({ min: 1, max: 1e5, noNaN: true })
const concentration = fc.double({ min: 0.01, max: 1e5, noNaN: true })

function inputs(ambient: readonly number[], inMask: readonly number[]): ExerciseInput[] {
  return COUNTED.map((e, i) => ({ exerciseKey: e.key, ambientBefore: ambient[i]!, ambientAfter: ambient[i]!, inMask: inMask[i]! }))
}

describe('overall fit factor properties', () => {
  it('lies between the lowest and highest exercise fit factor', () => {
    fc.assert(fc.property(fc.array(fitFactor, { minLength: 1, maxLength: 20 }), (values) => {
      const overall = harmonicMeanFitFactor(values)
      expect(overall).toBeGreaterThanOrEqual(Math.min(...values) * (1 - 1e-12))
      expect(overall).toBeLessThanOrEqual(Math.max(...values) * (1 + 1e-12))
    }))
  })

  it('never falls when one exercise fit factor rises', () => {
    fc.assert(fc.property(
      fc.array(fitFactor, { minLength: 1, maxLength: 20 }),
      fc.nat(),
      fc.double({ min: 1, max: 1000, noNaN: true }),
      (values, pick, factor) => {
        const raised = [...values]
        const i = pick % values.length
        raised[i] = raised[i]! * factor
        expect(harmonicMeanFitFactor(raised)).toBeGreaterThanOrEqual(harmonicMeanFitFactor(values) * (1 - 1e-12))
      }
    ))
  })

  it('scales every fit factor, and the overall, by k when every ambient is scaled by k', () => {
    fc.assert(fc.property(
      fc.array(concentration, { minLength: 7, maxLength: 7 }),
      fc.array(concentration, { minLength: 7, maxLength: 7 }),
      fc.double({ min: 0.01, max: 100, noNaN: true }),
      (ambient, inMask, k) => {
        const base = computeFitTest({ protocol: STANDARD_PROTOCOL, exercises: inputs(ambient, inMask), passLevel: 100 })
        const scaled = computeFitTest({ protocol: STANDARD_PROTOCOL, exercises: inputs(ambient.map(a => a * k), inMask), passLevel: 100 })
        expect(base.ok && scaled.ok).toBe(true)
        if (!base.ok || !scaled.ok) return
        base.exercises.forEach((e, i) => {
          if (!e.fitFactor) return
          expect(scaled.exercises[i]!.fitFactor!.value / e.fitFactor.value).toBeCloseTo(k, 9)
        })
        expect(scaled.overall.value / base.overall.value).toBeCloseTo(k, 9)
      }
    ))
  })
})

// Builds a 1 Hz series whose readings in each sampled phase average to the chosen means: the
// values mean ± spread alternate (the odd last reading of a phase is the mean itself).
function syntheticSeries(protocol: Protocol, ambientMeans: number[], maskMeans: number[], spread: number): string {
  const timeline = protocolTimeline(protocol)
  const lines = ['t,channel,conc']
  let ambientIndex = 0
  let maskIndex = 0
  for (const w of timeline.exercises) {
    for (const ph of w.phases) {
      if (ph.kind !== 'ambient' && ph.kind !== 'mask') {
        // purge and idle readings must not reach any mean: give them an absurd value
        for (let t = ph.startSeconds; t < ph.endSeconds; t++) lines.push(`${t},mask,999999`)
        continue
      }
      const mean = ph.kind === 'ambient' ? ambientMeans[ambientIndex++]! : maskMeans[maskIndex++]!
      const n = ph.endSeconds - ph.startSeconds
      for (let j = 0; j < n; j++) {
        const value = mean + (j % 2 === 0 ? spread : -spread) * (n % 2 === 1 && j === n - 1 ? 0 : 1)
        lines.push(`${ph.startSeconds + j},${ph.kind},${value}`)
      }
    }
  }
  return lines.join('\n')
}

describe('count-series properties', () => {
  it('gives back the means a synthetic series was built from', () => {
    const protocols = [STANDARD_PROTOCOL, MODIFIED_ELASTOMERIC_PROTOCOL]
    fc.assert(fc.property(
      fc.constantFrom(...protocols),
      fc.array(fc.double({ min: 100, max: 1e5, noNaN: true }), { minLength: 16, maxLength: 16 }),
      fc.array(fc.double({ min: 1, max: 1e3, noNaN: true }), { minLength: 16, maxLength: 16 }),
      fc.double({ min: 0, max: 0.9, noNaN: true }),
      (protocol, ambientMeans, maskMeans, spreadFraction) => {
        const spread = Math.min(...ambientMeans, ...maskMeans) * spreadFraction
        const r = parseCountSeries(syntheticSeries(protocol, ambientMeans, maskMeans, spread), protocol)
        expect(r.issues).toEqual([])
        const timeline = protocolTimeline(protocol)
        let maskIndex = 0
        timeline.exercises.forEach((w, i) => {
          const segment = r.segments[i]!
          if (!w.mask) return
          expect(segment.inMask!.mean).toBeCloseTo(maskMeans[maskIndex++]!, 6)
          if (w.ambientBefore) {
            const k = timeline.ambientPhases.indexOf(w.ambientBefore)
            expect(segment.ambientBefore!.mean).toBeCloseTo(ambientMeans[k]!, 6)
          }
          if (w.ambientAfter) {
            const k = timeline.ambientPhases.indexOf(w.ambientAfter)
            expect(segment.ambientAfter!.mean).toBeCloseTo(ambientMeans[k]!, 6)
          }
        })
      }
    ), { numRuns: 60 })
  })

  it('never throws on arbitrary text and always returns issues for it or readings from it', () => {
    const token = fc.oneof(
      fc.string(),
      fc.constantFrom(',', ';', '\t', '\n', '\r\n', '"', 'ambient', 'mask', 't,channel,conc', '-', '1e999', 'NaN', '2025-01-01T00:00:00Z'),
      fc.double().map(String)
    )
    fc.assert(fc.property(fc.oneof(fc.string({ unit: 'binary', maxLength: 300 }), fc.array(token, { maxLength: 60 }).map(t => t.join(''))), (text) => {
      const r = parseCountSeries(text, STANDARD_PROTOCOL)
      expect(Array.isArray(r.issues)).toBe(true)
      expect(Array.isArray(r.readings)).toBe(true)
      expect(r.issues.length + r.readings.length).toBeGreaterThan(0)
      for (const issue of r.issues) expect(typeof issue.message).toBe('string')
      for (const reading of r.readings) {
        expect(Number.isFinite(reading.seconds) && Number.isFinite(reading.concentration)).toBe(true)
        expect(reading.concentration).toBeGreaterThanOrEqual(0)
      }
    }), { numRuns: 500 })
  })

  it('never throws on values that are not text', () => {
    for (const value of [undefined, null, 42, {}, []]) {
      expect(readCountSeries(value).issues[0]!.code).toBe('empty-series')
    }
  })

  it('reads every decimal number exactly as Number() does', () => {
    fc.assert(fc.property(
      fc.oneof(
        fc.double({ min: 0, max: 1e9, noNaN: true }).map(String),
        fc.tuple(fc.double({ min: 0, max: 1e6, noNaN: true }), fc.integer({ min: 0, max: 12 })).map(([x, d]) => x.toFixed(d)),
        fc.tuple(fc.nat(), fc.nat()).map(([a, b]) => `${a}.${b}`)
      ),
      (text) => {
        const r = readCountSeries(`0,ambient,${text}`)
        expect(r.readings[0]!.concentration).toBe(Number(text))
      }
    ))
  })
})
