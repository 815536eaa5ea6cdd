// The training lab's inputs: what a trainer may type, the ranges the lab accepts, the leak
// patterns offered as presets, and the set-up carried in a shared link. Pure: no Vue, no Nitro.
import type { CountingConditions, Protocol } from './compute'
import type { DecimalMark } from './number-reader'
import { formatTypedNumber, plainTypedNumber, readTypedNumber } from './number-reader'
import {
  BUILT_IN_PROTOCOLS,
  expectedInMaskCount,
  largestResolvableFitFactor,
  sampleSecondsForFitFactor
} from './compute'

/** Every number typed in the lab goes through the program's one reader, with the organization's decimal mark. */
export function readLabNumber(text: string, decimalMark: DecimalMark = 'point'): { ok: true, value: number } | { ok: false, message: string } {
  const read = readTypedNumber(text, { decimalMark })
  if (read.ok) return { ok: true, value: read.value }
  return { ok: false, message: read.empty ? 'Enter a number.' : read.message }
}

export interface LabFieldRule {
  label: string
  unit: string
  min: number
  max: number
  /** min itself is allowed (≥) or not (>) */
  minInclusive: boolean
  maxInclusive: boolean
  integer?: boolean
}

/**
 * Ranges of our own (no published source): wide enough for any room, hood or counter a class
 * will meet, narrow enough that a slip of the decimal point is caught.
 */
export const LAB_FIELDS = {
  ambient: { label: 'Ambient concentration', unit: 'particles/cm³', min: 0, max: 1_000_000, minInclusive: false, maxInclusive: true },
  flow: { label: 'Counter sample flow', unit: 'cm³/min', min: 0, max: 10_000, minInclusive: false, maxInclusive: true },
  fitFactor: { label: 'Fit factor', unit: '', min: 1, max: 1_000_000, minInclusive: true, maxInclusive: true },
  precisionPercent: { label: 'Relative precision', unit: '%', min: 0, max: 100, minInclusive: false, maxInclusive: false },
  sampleSeconds: { label: 'In-mask sample time', unit: 's', min: 0, max: 3600, minInclusive: false, maxInclusive: true },
  passLevel: { label: 'Pass level', unit: '', min: 1, max: 100_000, minInclusive: true, maxInclusive: true },
  runs: { label: 'Number of simulated tests', unit: '', min: 1, max: 10_000, minInclusive: true, maxInclusive: true, integer: true },
  seed: { label: 'Seed', unit: '', min: 0, max: 4_294_967_295, minInclusive: true, maxInclusive: true, integer: true }
} as const satisfies Record<string, LabFieldRule>
export type LabField = keyof typeof LAB_FIELDS

/** A typed lab value, or the sentence to show beside its field. Never Infinity or NaN. */
export function checkLabField(field: LabField, text: string, decimalMark: DecimalMark = 'point'): { ok: true, value: number } | { ok: false, message: string } {
  const rule: LabFieldRule = LAB_FIELDS[field]
  const fmt = (n: number) => formatTypedNumber(Number(n.toPrecision(12)), decimalMark)
  const read = readLabNumber(text, decimalMark)
  if (!read.ok) return read
  const v = read.value
  const unit = rule.unit ? ` ${rule.unit}` : ''
  if (rule.integer && !Number.isInteger(v)) return { ok: false, message: `${rule.label} must be a whole number.` }
  const lowOk = rule.minInclusive ? v >= rule.min : v > rule.min
  const highOk = rule.maxInclusive ? v <= rule.max : v < rule.max
  if (!lowOk || !highOk) {
    const low = rule.minInclusive ? `from ${fmt(rule.min)}` : `above ${fmt(rule.min)}`
    const high = rule.maxInclusive ? `up to ${fmt(rule.max)}` : `below ${fmt(rule.max)}`
    return { ok: false, message: `${rule.label} must be ${low} ${high}${unit}; you entered ${fmt(v)}.` }
  }
  return { ok: true, value: v }
}

export interface PlannerTarget {
  fitFactor: number
  /** relative precision r as a fraction, 0 < r < 1 */
  precision: number
  sampleSeconds: number
}

export interface PlannerAnswer {
  /** in-mask sample seconds to resolve the target at precision r: t = FF / (C·Q·r²) */
  secondsForTarget: number
  /** in-mask counts expected at the target in that time (= 1/r²) */
  expectedCountAtTarget: number
  /** in-mask counts expected at the target in the given sample time */
  expectedCountInSampleTime: number
  /** largest fit factor resolvable at precision r in the given sample time: C·Q·t·r² */
  largestResolvable: number
}

/** The planner's figures for one set-up (formulas in compute/test-length.ts, derived there). */
export function planSetup(conditions: CountingConditions, target: PlannerTarget): PlannerAnswer {
  const secondsForTarget = sampleSecondsForFitFactor(conditions, target.fitFactor, target.precision)
  return {
    secondsForTarget,
    expectedCountAtTarget: expectedInMaskCount(conditions, target.fitFactor, secondsForTarget),
    expectedCountInSampleTime: expectedInMaskCount(conditions, target.fitFactor, target.sampleSeconds),
    largestResolvable: largestResolvableFitFactor(conditions, target.sampleSeconds, target.precision)
  }
}

/** Sample seconds against fit factor, evenly spaced on a log scale, for the log–log chart. */
export function planCurve(conditions: CountingConditions, precision: number, fromFitFactor = 10, toFitFactor = 100_000, points = 41): { fitFactor: number, seconds: number }[] {
  const out: { fitFactor: number, seconds: number }[] = []
  const a = Math.log10(fromFitFactor)
  const b = Math.log10(toFitFactor)
  for (let i = 0; i < points; i++) {
    const ff = 10 ** (a + (i * (b - a)) / (points - 1))
    out.push({ fitFactor: ff, seconds: sampleSecondsForFitFactor(conditions, ff, precision) })
  }
  return out
}

/** A leak pattern: the true fit factor of each counted exercise, for a protocol. */
export interface LeakPreset {
  key: string
  label: string
  /** null when the protocol has no exercise the pattern is about */
  factorsFor: (protocol: Protocol, passLevel: number) => Record<string, number> | null
}

function pattern(protocol: Protocol, base: number, leaky: (key: string) => boolean, leakValue: number): Record<string, number> | null {
  const counted = protocol.exercises.filter(e => e.counted)
  if (leakValue !== base && !counted.some(e => leaky(e.key))) return null
  return Object.fromEntries(counted.map(e => [e.key, leaky(e.key) ? leakValue : base]))
}

/** Invented teaching patterns; the numbers are illustrations, not measurements. */
export const LEAK_PRESETS: LeakPreset[] = [
  { key: 'good-seal', label: 'Good seal throughout', factorsFor: (p, level) => pattern(p, level * 20, () => false, level * 20) },
  { key: 'talking-leak', label: 'Seal lifts when talking', factorsFor: (p, level) => pattern(p, level * 20, k => k.includes('talking'), Math.max(1, level / 10)) },
  { key: 'bending-leak', label: 'Seal lifts when bending', factorsFor: (p, level) => pattern(p, level * 20, k => k.includes('bending'), Math.max(1, level / 5)) },
  { key: 'head-movement-leak', label: 'Leaks on head movements', factorsFor: (p, level) => pattern(p, level * 10, k => k.startsWith('head-'), level * 0.8) },
  { key: 'borderline', label: 'Just above the pass level everywhere', factorsFor: (p, level) => pattern(p, level * 1.2, () => false, level * 1.2) },
  { key: 'poor-fit', label: 'Poor fit everywhere', factorsFor: (p, level) => pattern(p, Math.max(1, level / 4), () => false, Math.max(1, level / 4)) }
]

export const LAB_PROTOCOLS = BUILT_IN_PROTOCOLS

/** Pass levels the lab offers, each with where it comes from (the pass-level table in DOMAIN.md). */
export const LAB_PASS_LEVELS = [
  { value: 100, label: '100 — half masks (29 CFR 1910.134(f)(7); HSE INDG479)' },
  { value: 500, label: '500 — full facepieces (29 CFR 1910.134(f)(7))' },
  { value: 2000, label: '2000 — full facepieces (HSE INDG479, via secondary summaries)' }
] as const

export const LAB_DEFAULTS = {
  a: { label: 'Older counter', ambient: '1000', flow: '100' },
  b: { label: 'Current counter', ambient: '1000', flow: '350' },
  fitFactor: '500',
  precisionPercent: '10',
  sampleSeconds: '46',
  protocolKey: 'osha-standard',
  passLevel: '100',
  ambient: '1000',
  flow: '350',
  runs: '1000',
  seed: '2024'
} as const

export type LabTextState = {
  aLabel: string
  aAmbient: string
  aFlow: string
  bLabel: string
  bAmbient: string
  bFlow: string
  fitFactor: string
  precisionPercent: string
  sampleSeconds: string
  protocolKey: string
  passLevel: string
  ambient: string
  flow: string
  runs: string
  seed: string
  /** true fit factor per exercise key, as typed */
  trueFactors: Record<string, string>
}

/** Query-string names of the shared set-up; short, so a link fits on a slide. */
const QUERY_KEYS: Record<Exclude<keyof LabTextState, 'trueFactors'>, string> = {
  aLabel: 'al', aAmbient: 'ac', aFlow: 'aq',
  bLabel: 'bl', bAmbient: 'bc', bFlow: 'bq',
  fitFactor: 'ff', precisionPercent: 'r', sampleSeconds: 't',
  protocolKey: 'p', passLevel: 'lvl', ambient: 'c', flow: 'q', runs: 'n', seed: 'seed'
}
const MAX_QUERY_TEXT = 60

/** The set-up's fields that hold a typed number (the rest are labels and choices). */
const NUMBER_FIELDS: { field: Exclude<keyof LabTextState, 'trueFactors'>, rule: LabField }[] = [
  { field: 'aAmbient', rule: 'ambient' }, { field: 'aFlow', rule: 'flow' },
  { field: 'bAmbient', rule: 'ambient' }, { field: 'bFlow', rule: 'flow' },
  { field: 'fitFactor', rule: 'fitFactor' }, { field: 'precisionPercent', rule: 'precisionPercent' },
  { field: 'sampleSeconds', rule: 'sampleSeconds' }, { field: 'passLevel', rule: 'passLevel' },
  { field: 'ambient', rule: 'ambient' }, { field: 'flow', rule: 'flow' }, { field: 'runs', rule: 'runs' }, { field: 'seed', rule: 'seed' }
]

/** True when a query string carries a lab set-up (other parameters, such as a lesson number, do not count). */
export function hasLabQuery(query: Record<string, unknown>): boolean {
  return [...Object.values(QUERY_KEYS), 'tf', 'dm'].some(k => k in query)
}

export function defaultLabState(): LabTextState {
  const protocol = BUILT_IN_PROTOCOLS.find(p => p.key === LAB_DEFAULTS.protocolKey)!
  const factors = LEAK_PRESETS[1]!.factorsFor(protocol, Number(LAB_DEFAULTS.passLevel))!
  return {
    aLabel: LAB_DEFAULTS.a.label, aAmbient: LAB_DEFAULTS.a.ambient, aFlow: LAB_DEFAULTS.a.flow,
    bLabel: LAB_DEFAULTS.b.label, bAmbient: LAB_DEFAULTS.b.ambient, bFlow: LAB_DEFAULTS.b.flow,
    fitFactor: LAB_DEFAULTS.fitFactor, precisionPercent: LAB_DEFAULTS.precisionPercent, sampleSeconds: LAB_DEFAULTS.sampleSeconds,
    protocolKey: LAB_DEFAULTS.protocolKey, passLevel: LAB_DEFAULTS.passLevel, ambient: LAB_DEFAULTS.ambient, flow: LAB_DEFAULTS.flow,
    runs: LAB_DEFAULTS.runs, seed: LAB_DEFAULTS.seed,
    trueFactors: Object.fromEntries(Object.entries(factors).map(([k, v]) => [k, String(v)]))
  }
}

/**
 * The set-up as a query string. Text is carried as typed, with the decimal mark it was typed in:
 * `dm=comma` when that is a comma, nothing when it is a point, so every link written before the
 * setting existed (all with a point) still reads as it did. See `decodeLabQuery` and
 * `rewriteLabNumbers` for how a link opened in the other mark is read.
 */
export function encodeLabQuery(state: LabTextState, decimalMark: DecimalMark = 'point'): Record<string, string> {
  const out: Record<string, string> = decimalMark === 'comma' ? { dm: 'comma' } : {}
  for (const [field, key] of Object.entries(QUERY_KEYS) as [keyof typeof QUERY_KEYS, string][]) out[key] = state[field]
  const protocol = BUILT_IN_PROTOCOLS.find(p => p.key === state.protocolKey)
  if (protocol) out.tf = protocol.exercises.filter(e => e.counted).map(e => state.trueFactors[e.key] ?? '').join('~')
  return out
}

/**
 * A shared link back into a set-up; anything missing keeps the default, text stays as it was sent
 * (a bad value then shows its message beside the field). What could not be used is named in `notices`.
 * `decimalMark` is the mark the link's numbers are written in (a point unless it says `dm=comma`);
 * pass the state through `rewriteLabNumbers` when the reader's organization uses the other one.
 */
export function decodeLabQuery(query: Record<string, unknown>): { state: LabTextState, notices: string[], decimalMark: DecimalMark } {
  const state = defaultLabState()
  const notices: string[] = []
  let decimalMark: DecimalMark = 'point'
  if (query.dm === 'comma') decimalMark = 'comma'
  else if (query.dm !== undefined && query.dm !== 'point') notices.push('The link names a decimal mark the lab does not know; its numbers are read with a point.')
  for (const [field, key] of Object.entries(QUERY_KEYS) as [keyof typeof QUERY_KEYS, string][]) {
    const v = query[key]
    if (typeof v === 'string') state[field] = v.slice(0, MAX_QUERY_TEXT)
  }
  const protocol = BUILT_IN_PROTOCOLS.find(p => p.key === state.protocolKey)
  if (!protocol) {
    notices.push(`The link names a protocol the lab does not know ("${state.protocolKey}"); the standard protocol is shown instead.`)
    state.protocolKey = LAB_DEFAULTS.protocolKey
  }
  const chosen = protocol ?? BUILT_IN_PROTOCOLS.find(p => p.key === LAB_DEFAULTS.protocolKey)!
  const counted = chosen.exercises.filter(e => e.counted)
  const tf = typeof query.tf === 'string' ? query.tf.split('~') : null
  if (tf && tf.length === counted.length) {
    state.trueFactors = Object.fromEntries(counted.map((e, i) => [e.key, tf[i]!.slice(0, MAX_QUERY_TEXT)]))
  } else if (tf || (protocol && protocol.key !== LAB_DEFAULTS.protocolKey)) {
    if (tf) notices.push('The link\'s true fit factors do not match the protocol\'s exercises; a good seal is shown instead.')
    const factors = LEAK_PRESETS[0]!.factorsFor(chosen, 100)!
    state.trueFactors = Object.fromEntries(Object.entries(factors).map(([k, v]) => [k, String(v)]))
  }
  return { state, notices, decimalMark }
}

/**
 * The set-up's numbers rewritten from one decimal mark to the other, value for value ("0,5" → "0.5").
 * A text that cannot be read in the mark it was written in is kept only when the new mark refuses
 * it too (so its message still shows beside the field); if the new mark would read it as some
 * other number ("1,5" written with a point, read with a comma as 1.5) it is emptied and named in
 * `notices`, never silently given a meaning it did not have.
 */
export function rewriteLabNumbers(state: LabTextState, from: DecimalMark, to: DecimalMark): { state: LabTextState, notices: string[] } {
  if (from === to) return { state, notices: [] }
  const notices: string[] = []
  const exercises = BUILT_IN_PROTOCOLS.find(p => p.key === state.protocolKey)?.exercises ?? []
  const rewrite = (text: string, name: string): string => {
    const read = readTypedNumber(text, { decimalMark: from })
    if (read.ok) return plainTypedNumber(read.value, to)
    if (read.empty || !readTypedNumber(text, { decimalMark: to }).ok) return text
    notices.push(`${name}: the link's "${text}" was written with a ${from} as decimal mark and cannot be read; type it again.`)
    return ''
  }
  const next: LabTextState = { ...state, trueFactors: {} }
  for (const { field, rule } of NUMBER_FIELDS) next[field] = rewrite(state[field], LAB_FIELDS[rule].label)
  for (const [key, text] of Object.entries(state.trueFactors)) next.trueFactors[key] = rewrite(text, `True fit factor, ${exercises.find(e => e.key === key)?.name ?? key}`)
  return { state: next, notices }
}
