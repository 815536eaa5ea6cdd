import type { ComputeIssue, ComputeResult } from './errors'
import { errorIssue } from './errors'
import type { FitCategory, RespiratorClass } from './respirator-classes'
import { FIT_CATEGORY_LABELS, findRespiratorClass } from './respirator-classes'

// Pass levels for the overall fit factor of a quantitative fit test, by rule set and fit
// category. ISO 16975-3, ANSI Z88.10 and CSA Z94.4 values are not public and not encoded.

export type PassLevelRuleSetKey = 'us-osha' | 'uk-hse'

export interface PassLevelRuleSet {
  key: PassLevelRuleSetKey
  label: string
  levels: Readonly<Record<FitCategory, number>>
  source: string
}

export const PASS_LEVEL_RULE_SETS: Readonly<Record<PassLevelRuleSetKey, PassLevelRuleSet>> = {
  'us-osha': {
    key: 'us-osha',
    label: 'United States (OSHA)',
    levels: { half: 100, full: 500 },
    source: '29 CFR 1910.134(f)(7)'
  },
  'uk-hse': {
    key: 'uk-hse',
    label: 'United Kingdom (HSE)',
    levels: { half: 100, full: 2000 },
    source: 'HSE INDG479 (2019), via secondary summaries'
  }
}

export const PASS_LEVEL_RULE_SET_KEYS = Object.keys(PASS_LEVEL_RULE_SETS) as PassLevelRuleSetKey[]

// An organization's own levels. A respirator-class entry wins over a fit-category entry.
export interface PassLevelOverrides {
  byFitCategory?: Partial<Record<FitCategory, number>>
  byRespiratorClass?: Readonly<Record<string, number>>
}

export interface ResolvedPassLevel {
  level: number
  fitCategory: FitCategory
  ruleSetLevel: number
  raisedByOrganization: boolean
  citation: string
}

export function ruleSetPassLevel(ruleSet: PassLevelRuleSetKey, fitCategory: FitCategory): number {
  return PASS_LEVEL_RULE_SETS[ruleSet].levels[fitCategory]
}

function checkOverride(
  value: unknown,
  floor: number,
  subject: string,
  ruleSet: PassLevelRuleSet,
  field: string
): ComputeIssue | null {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    return errorIssue('invalid-setting', `${subject} must be a positive number`, { field })
  }
  if (value < floor) {
    return errorIssue(
      'below-rule-set',
      `${subject} cannot be ${value}: ${ruleSet.label} requires at least ${floor} (${ruleSet.source}); an organization may raise a pass level, never lower it`,
      { field }
    )
  }
  return null
}

// Checks an organization's overrides against its rule set: each must be a positive number not
// below the rule set's level for that fit category.
export function validatePassLevelOverrides(
  ruleSetKey: PassLevelRuleSetKey,
  overrides: PassLevelOverrides
): ComputeResult<PassLevelOverrides> {
  const ruleSet = PASS_LEVEL_RULE_SETS[ruleSetKey]
  const issues: ComputeIssue[] = []
  for (const [category, value] of Object.entries(overrides.byFitCategory ?? {}) as [FitCategory, number][]) {
    if (!(category in ruleSet.levels)) {
      issues.push(errorIssue('invalid-setting', `'${category}' is not a fit category`, { field: `byFitCategory.${category}` }))
      continue
    }
    const issue = checkOverride(value, ruleSet.levels[category], `Pass level for ${FIT_CATEGORY_LABELS[category].toLowerCase()}`, ruleSet, `byFitCategory.${category}`)
    if (issue) issues.push(issue)
  }
  for (const [classKey, value] of Object.entries(overrides.byRespiratorClass ?? {})) {
    const field = `byRespiratorClass.${classKey}`
    const cls = findRespiratorClass(classKey)
    if (!cls) {
      issues.push(errorIssue('invalid-setting', `'${classKey}' is not a known respirator class`, { field }))
      continue
    }
    if (!cls.fitCategory) {
      issues.push(errorIssue('not-fit-tested', `${cls.label} is loose-fitting and is not fit tested, so it has no pass level`, { field }))
      continue
    }
    const issue = checkOverride(value, ruleSet.levels[cls.fitCategory], `Pass level for ${cls.label}`, ruleSet, field)
    if (issue) issues.push(issue)
  }
  return issues.length ? { ok: false, issues } : { ok: true, value: overrides, issues }
}

// The level a fit test of this respirator class must reach under the rule set and the
// organization's overrides. Overrides below the rule set are refused, not silently raised.
export function resolvePassLevel(options: {
  ruleSet: PassLevelRuleSetKey
  respiratorClass: string | RespiratorClass
  overrides?: PassLevelOverrides
}): ComputeResult<ResolvedPassLevel> {
  const ruleSet = PASS_LEVEL_RULE_SETS[options.ruleSet]
  if (!ruleSet) {
    return { ok: false, issues: [errorIssue('invalid-setting', `'${String(options.ruleSet)}' is not a known pass-level rule set`, { field: 'ruleSet' })] }
  }
  const cls = typeof options.respiratorClass === 'string'
    ? findRespiratorClass(options.respiratorClass)
    : options.respiratorClass
  if (!cls) {
    return { ok: false, issues: [errorIssue('invalid-setting', `'${String(options.respiratorClass)}' is not a known respirator class`, { field: 'respiratorClass' })] }
  }
  if (!cls.fitCategory) {
    return { ok: false, issues: [errorIssue('not-fit-tested', `${cls.label} is loose-fitting and is not fit tested, so it has no pass level`, { field: 'respiratorClass' })] }
  }
  if (options.overrides) {
    const checked = validatePassLevelOverrides(options.ruleSet, options.overrides)
    if (!checked.ok) return checked
  }
  const ruleSetLevel = ruleSet.levels[cls.fitCategory]
  const override = options.overrides?.byRespiratorClass?.[cls.key] ?? options.overrides?.byFitCategory?.[cls.fitCategory]
  const level = override ?? ruleSetLevel
  return {
    ok: true,
    issues: [],
    value: {
      level,
      fitCategory: cls.fitCategory,
      ruleSetLevel,
      raisedByOrganization: level > ruleSetLevel,
      citation: level > ruleSetLevel ? `Organization setting (rule set: ${ruleSet.source})` : ruleSet.source
    }
  }
}
