// Benchmarks of the training lab on this machine: `npm run bench:lab`.
// Prints figures only; nothing here asserts a timing. Inputs are invented.
// Targets (issue 13): planner and operating characteristic within 16 ms of a slider move;
// 10,000 simulated tests within 200 ms (they run in a Web Worker, off the page's main thread).
import {
  MODIFIED_FILTERING_FACEPIECE_PROTOCOL,
  STANDARD_PROTOCOL,
  operatingCharacteristic,
  simulateCountTrace,
  simulateFitTests
} from '../shared/utils/compute/index.ts'
import { planCurve, planSetup } from '../shared/utils/lab-setup.ts'

function time(label: string, repeat: number, run: () => unknown): number {
  run() // warm-up
  const started = performance.now()
  for (let i = 0; i < repeat; i++) run()
  const ms = (performance.now() - started) / repeat
  console.log(`${label.padEnd(74)} ${ms.toFixed(ms < 1 ? 3 : 1).padStart(8)} ms`)
  return ms
}

const talkingLeak = Object.fromEntries(STANDARD_PROTOCOL.exercises.filter(e => e.counted).map(e => [e.key, e.key === 'talking' ? 10 : 2000]))
console.log(`Training lab benchmark — Node ${process.version}, ${new Date().toISOString()}`)

time('planner: both set-ups (figures + 41-point log-log curve each)', 2000, () => {
  for (const flow of [100, 350]) {
    planSetup({ ambient: 1000, flowCm3PerMin: flow }, { fitFactor: 500, precision: 0.1, sampleSeconds: 46 })
    planCurve({ ambient: 1000, flowCm3PerMin: flow }, 0.1)
  }
})

const oc = (ambient: number, flow: number, protocol = STANDARD_PROTOCOL, runs = 1000) => () => operatingCharacteristic({
  protocol, profile: protocol === STANDARD_PROTOCOL ? talkingLeak : 1, ambient, sampleFlowCm3PerMin: flow, passLevel: 100,
  fromFitFactor: 10, toFitFactor: 1000, points: 41, seed: 7, runs
})
time('OC curve, 41 points, standard protocol, 1,000 /cm³ at 350 (normal approx.)', 200, oc(1000, 350))
time('OC curve ×3 as the Repeat page draws it (this set-up, planner A and B)', 100, () => {
  oc(1000, 350)()
  oc(1000, 100)()
  oc(1000, 350)()
})
time('OC curve, 41 points, 20 /cm³ at 100 (few counts: Monte Carlo, 1,000 runs a point)', 5, oc(20, 100, MODIFIED_FILTERING_FACEPIECE_PROTOCOL))

const input = { protocol: STANDARD_PROTOCOL, trueFitFactors: talkingLeak, ambient: 1000, sampleFlowCm3PerMin: 350, passLevel: 100, seed: 2024 }
time('one simulated test second by second (the live run), standard protocol', 200, () => simulateCountTrace(input))
for (const runs of [1000, 10000]) {
  time(`${runs.toLocaleString('en-US')} simulated tests, standard protocol (Repeat it)`, runs === 1000 ? 10 : 3, () => simulateFitTests({ ...input, runs }))
}
time('10,000 simulated tests, modified filtering-facepiece protocol', 3, () => simulateFitTests({ ...input, protocol: MODIFIED_FILTERING_FACEPIECE_PROTOCOL, trueFitFactors: 300, runs: 10000 }))
