// The training lab's heavy sums, off the main thread so a slider never freezes the page.
import { expose } from 'comlink'
import { findBuiltInProtocol, operatingCharacteristic, simulateFitTests } from '#shared/utils/compute'
import type { OperatingCharacteristic, SimulationSummary } from '#shared/utils/compute'

export interface LabRunInput {
  protocolKey: string
  trueFitFactors: Record<string, number>
  ambient: number
  sampleFlowCm3PerMin: number
  passLevel: number
  seed: number
}

function protocolOf(key: string) {
  const protocol = findBuiltInProtocol(key)
  if (!protocol) throw new Error(`Unknown protocol ${key}`)
  return protocol
}

const api = {
  repeat(input: LabRunInput & { runs: number }): { summary: SimulationSummary, milliseconds: number } {
    const started = performance.now()
    const summary = simulateFitTests({ ...input, protocol: protocolOf(input.protocolKey) })
    return { summary, milliseconds: performance.now() - started }
  },
  operatingCharacteristic(input: LabRunInput & { fromFitFactor: number, toFitFactor: number, points: number, runs?: number }): { curve: OperatingCharacteristic, milliseconds: number } {
    const started = performance.now()
    const { trueFitFactors, ...rest } = input
    const curve = operatingCharacteristic({ ...rest, profile: trueFitFactors, protocol: protocolOf(input.protocolKey) })
    return { curve, milliseconds: performance.now() - started }
  }
}

export type LabWorkerApi = typeof api
expose(api)
