import { z } from 'zod'
import type { ComputeIssue, ComputeResult } from './errors'
import { errorIssue } from './errors'

// Acceptance rules for a measured value: headform sub-checks and readiness-check steps use the
// same rules. Bounds are inclusive (a value exactly at a limit is accepted).

export type AcceptanceRule
  = | { kind: 'at-most', max: number, unit?: string }
    | { kind: 'at-least', min: number, unit?: string }
    | { kind: 'between', min: number, max: number, unit?: string }
    | { kind: 'pass-fail' }

export interface AcceptanceVerdict {
  passed: boolean
  // e.g. "12.5 Pa is at most 20 Pa", "0.8 is below the minimum of 1"
  message: string
}

const finiteNumber = (label: string) => z.number({ error: `${label} must be a number` })

export const acceptanceRuleSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('at-most'), max: finiteNumber('Maximum'), unit: z.string().trim().max(20).optional() }),
  z.object({ kind: z.literal('at-least'), min: finiteNumber('Minimum'), unit: z.string().trim().max(20).optional() }),
  z.object({ kind: z.literal('between'), min: finiteNumber('Minimum'), max: finiteNumber('Maximum'), unit: z.string().trim().max(20).optional() })
    .refine(r => r.min <= r.max, { error: 'Minimum must not be above the maximum', path: ['max'] }),
  z.object({ kind: z.literal('pass-fail') })
], { error: 'Choose a rule: at most, at least, between, or pass/fail' })

function withUnit(value: number, unit: string | undefined): string {
  return unit ? `${value} ${unit}` : String(value)
}

// Verdict of a measured value (or a pass/fail observation) against its rule.
export function evaluateAcceptanceRule(
  rule: AcceptanceRule,
  value: number | boolean | null | undefined,
  label = 'The value'
): ComputeResult<AcceptanceVerdict> {
  const issues: ComputeIssue[] = []
  if (rule.kind === 'pass-fail') {
    if (typeof value !== 'boolean') {
      issues.push(errorIssue('missing', `${label} needs a pass or fail`, { field: 'value' }))
      return { ok: false, issues }
    }
    return { ok: true, issues, value: { passed: value, message: value ? `${label}: pass` : `${label}: fail` } }
  }
  if (value === null || value === undefined) {
    issues.push(errorIssue('missing', `${label} is missing; enter a number`, { field: 'value' }))
    return { ok: false, issues }
  }
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    issues.push(errorIssue('not-a-number', `${label} must be a number`, { field: 'value' }))
    return { ok: false, issues }
  }
  const shown = withUnit(value, rule.unit)
  if (rule.kind === 'at-most') {
    const passed = value <= rule.max
    return { ok: true, issues, value: { passed, message: passed ? `${shown} is at most ${withUnit(rule.max, rule.unit)}` : `${shown} is above the maximum of ${withUnit(rule.max, rule.unit)}` } }
  }
  if (rule.kind === 'at-least') {
    const passed = value >= rule.min
    return { ok: true, issues, value: { passed, message: passed ? `${shown} is at least ${withUnit(rule.min, rule.unit)}` : `${shown} is below the minimum of ${withUnit(rule.min, rule.unit)}` } }
  }
  const passed = value >= rule.min && value <= rule.max
  const message = passed
    ? `${shown} is between ${withUnit(rule.min, rule.unit)} and ${withUnit(rule.max, rule.unit)}`
    : value < rule.min
      ? `${shown} is below the minimum of ${withUnit(rule.min, rule.unit)}`
      : `${shown} is above the maximum of ${withUnit(rule.max, rule.unit)}`
  return { ok: true, issues, value: { passed, message } }
}

// Short text of a rule for a form or a record: "≤ 20 Pa", "between 1 and 3 s", "pass / fail".
export function describeAcceptanceRule(rule: AcceptanceRule): string {
  switch (rule.kind) {
    case 'at-most': return `≤ ${withUnit(rule.max, rule.unit)}`
    case 'at-least': return `≥ ${withUnit(rule.min, rule.unit)}`
    case 'between': return `between ${rule.min} and ${withUnit(rule.max, rule.unit)}`
    case 'pass-fail': return 'pass / fail'
  }
}
