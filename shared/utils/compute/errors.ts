// Issues are how the module reports a problem: it never throws on user input. A page shows each
// issue beside the field it names; a route turns the error-severity ones into a 422.

export type IssueSeverity = 'error' | 'warning'

export type IssueCode
  = | 'missing'
    | 'not-positive'
    | 'not-a-number'
    | 'negative'
    | 'zero-without-volume'
    | 'unknown-exercise'
    | 'duplicate-exercise'
    | 'missing-exercise'
    | 'invalid-setting'
    | 'lower-bound-below-level'
    | 'below-rule-set'
    | 'not-fit-tested'
    | 'empty-series'
    | 'unknown-layout'
    | 'unknown-channel'
    | 'time-backwards'
    | 'time-format'
    | 'gap'
    | 'outside-protocol'
    | 'extra-columns'
    | 'no-in-mask-readings'
    | 'no-ambient-readings'
    | 'channel-phase-mismatch'
    | 'idlh-atmosphere'

export interface ComputeIssue {
  severity: IssueSeverity
  code: IssueCode
  message: string
  exerciseKey?: string
  exerciseName?: string
  field?: string
  // 1-based line and cell of pasted text, as the user sees them in their editor
  row?: number
  column?: number
}

export type ComputeResult<T>
  = | { ok: true, value: T, issues: ComputeIssue[] }
    | { ok: false, issues: ComputeIssue[] }

// For server code that wants an exception: carries the issues so a route can put them in `data`.
export class ComputeError extends Error {
  readonly issues: ComputeIssue[]

  constructor(issues: ComputeIssue[]) {
    super(issues.filter(i => i.severity === 'error').map(i => i.message).join('; ') || 'Computation failed')
    this.name = 'ComputeError'
    this.issues = issues
  }
}

export function unwrap<T>(result: ComputeResult<T>): T {
  if (!result.ok) throw new ComputeError(result.issues)
  return result.value
}

export function hasErrors(issues: readonly ComputeIssue[]): boolean {
  return issues.some(i => i.severity === 'error')
}

export function errorIssue(code: IssueCode, message: string, extra: Partial<ComputeIssue> = {}): ComputeIssue {
  return { severity: 'error', code, message, ...extra }
}

export function warningIssue(code: IssueCode, message: string, extra: Partial<ComputeIssue> = {}): ComputeIssue {
  return { severity: 'warning', code, message, ...extra }
}

// Checks one entered quantity that must be a positive, finite number. `subject` reads like
// "Ambient before for 'Talking'" so the message names both the field and the exercise.
export function checkPositive(
  value: unknown,
  subject: string,
  extra: Partial<ComputeIssue> = {}
): { ok: true, value: number } | { ok: false, issue: ComputeIssue } {
  if (value === undefined || value === null || value === '') {
    return { ok: false, issue: errorIssue('missing', `${subject} is missing; enter a positive number`, extra) }
  }
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    return { ok: false, issue: errorIssue('not-positive', `${subject} must be a positive number`, extra) }
  }
  return { ok: true, value }
}

// Like checkPositive, but zero is allowed (in-mask concentrations and counts may be zero).
export function checkNonNegative(
  value: unknown,
  subject: string,
  extra: Partial<ComputeIssue> = {}
): { ok: true, value: number } | { ok: false, issue: ComputeIssue } {
  if (value === undefined || value === null || value === '') {
    return { ok: false, issue: errorIssue('missing', `${subject} is missing; enter zero or a positive number`, extra) }
  }
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
    return { ok: false, issue: errorIssue('negative', `${subject} must be zero or a positive number`, extra) }
  }
  return { ok: true, value }
}
