// Benchmarks of the computation module on this machine: `npm run bench`.
// Prints figures only; nothing here asserts a timing. Inputs are invented.
import {
  STANDARD_PROTOCOL,
  computeFitTest,
  mulberry32,
  parseCountSeries,
  protocolTimeline
} from '../shared/utils/compute/index.ts'
import type { ExerciseInput, FitTestInput, Protocol } from '../shared/utils/compute/index.ts'

const random = mulberry32(20240917)
const counted = STANDARD_PROTOCOL.exercises.filter(e => e.counted)

function storedTest(withCounts: boolean): FitTestInput {
  const ambient = 500 + random() * 9500
  const exercises: ExerciseInput[] = counted.map((e) => {
    const fitFactor = 20 * Math.exp(random() * 5)
    const inMask = ambient / fitFactor
    const entry: ExerciseInput = {
      exerciseKey: e.key,
      ambientBefore: ambient * (0.95 + random() * 0.1),
      ambientAfter: ambient * (0.95 + random() * 0.1),
      inMask
    }
    if (withCounts) entry.inMaskCount = Math.round(inMask * (350 / 60) * e.sampling.maskSeconds)
    return entry
  })
  return { protocol: STANDARD_PROTOCOL, exercises, passLevel: 100, sampleFlowCm3PerMin: withCounts ? 350 : null }
}

function series(protocol: Protocol, hz: number): string {
  const timeline = protocolTimeline(protocol)
  const phases = timeline.exercises.flatMap(w => w.phases)
  const lines = ['t,channel,conc']
  let p = 0
  for (let i = 0; i < timeline.durationSeconds * hz; i++) {
    const t = i / hz
    while (t >= phases[p]!.endSeconds) p++
    const channel = phases[p]!.kind === 'ambient' ? 'ambient' : 'mask'
    const conc = channel === 'ambient' ? 2000 + random() * 200 : 1 + random() * 10
    lines.push(`${Number(t.toFixed(1))},${channel},${conc.toFixed(channel === 'ambient' ? 1 : 3)}`)
  }
  return lines.join('\n')
}

// Median and best of `rounds` timings, each the mean over `perRound` calls, in µs per call.
function time(rounds: number, perRound: number, fn: (i: number) => unknown): { median: number, best: number } {
  for (let i = 0; i < perRound; i++) fn(i)
  const results: number[] = []
  for (let r = 0; r < rounds; r++) {
    const start = performance.now()
    for (let i = 0; i < perRound; i++) fn(i)
    results.push(((performance.now() - start) * 1000) / perRound)
  }
  results.sort((a, b) => a - b)
  return { median: results[Math.floor(rounds / 2)]!, best: results[0]! }
}

const show = (label: string, t: { median: number, best: number }, unit: string, target?: string): void => {
  const figures = `${t.median.toFixed(2)} ${unit} (best ${t.best.toFixed(2)})`
  console.log(`${label.padEnd(58)} ${figures}${target ? `   target ${target}` : ''}`)
}

console.log(`Sealwright computation benchmark — Node ${process.version}, ${new Date().toISOString()}`)
console.log('median of 7 rounds (best in brackets)\n')

const plainTests = Array.from({ length: 1000 }, () => storedTest(false))
const countedTests = Array.from({ length: 1000 }, () => storedTest(true))
show('computeFitTest, standard protocol, means only', time(7, 20000, i => computeFitTest(plainTests[i % 1000]!)), 'µs/test', '< 50 µs')
show('computeFitTest, standard protocol, counts + intervals', time(7, 5000, i => computeFitTest(countedTests[i % 1000]!)), 'µs/test', '< 50 µs')
show('computeFitTest, counts, intervals: false', time(7, 20000, i => computeFitTest({ ...countedTests[i % 1000]!, intervals: false })), 'µs/test')

const series1Hz = series(STANDARD_PROTOCOL, 1)
const series10Hz = series(STANDARD_PROTOCOL, 10)
const readings1 = series1Hz.split('\n').length - 1
const readings10 = series10Hz.split('\n').length - 1
show(`parse + segment, 1 Hz standard series (${readings1} readings)`, time(7, 300, () => parseCountSeries(series1Hz, STANDARD_PROTOCOL)), 'µs/series', '< 1000 µs')
show(`parse + segment, 10 Hz standard series (${readings10} readings)`, time(7, 30, () => parseCountSeries(series10Hz, STANDARD_PROTOCOL)), 'µs/series')

function recompute(count: number, withCounts: boolean, intervals: boolean): number {
  const stored = Array.from({ length: count }, () => storedTest(withCounts))
  const start = performance.now()
  let passes = 0
  for (const test of stored) {
    const r = computeFitTest(intervals ? test : { ...test, intervals: false })
    if (r.ok && r.pass) passes++
  }
  const seconds = (performance.now() - start) / 1000
  if (passes < 0) console.log(passes)
  return seconds
}

console.log('')
console.log(`${'recompute 100,000 stored tests, means only'.padEnd(58)} ${recompute(100000, false, true).toFixed(2)} s`)
console.log(`${'recompute 100,000 stored tests, counts + intervals'.padEnd(58)} ${recompute(100000, true, true).toFixed(2)} s`)
console.log(`${'recompute 100,000 stored tests, counts, intervals: false'.padEnd(58)} ${recompute(100000, true, false).toFixed(2)} s`)
