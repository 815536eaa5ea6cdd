import { FIT_CATEGORY_LABELS, PASS_LEVEL_RULE_SETS, RESPIRATOR_CLASSES, validatePassLevelOverrides } from '#shared/utils/compute'
import type { FitCategory, PassLevelOverrides, PassLevelRuleSetKey } from '#shared/utils/compute'

type Organization = OrganizationRow

export function ruleSetOf(org: Pick<Organization, 'ruleSet'>) {
  return PASS_LEVEL_RULE_SETS[org.ruleSet as PassLevelRuleSetKey] ?? PASS_LEVEL_RULE_SETS['us-osha']
}

/** The levels an admin sees: the rule set's floor with its source, and the organization's own. */
export function passLevelView(org: Pick<Organization, 'ruleSet' | 'settings'>) {
  const rules = ruleSetOf(org)
  const overrides = org.settings.passLevelOverrides ?? {}
  const categories = (Object.keys(rules.levels) as FitCategory[]).map(category => ({
    fitCategory: category,
    label: FIT_CATEGORY_LABELS[category],
    ruleSetLevel: rules.levels[category],
    level: overrides.byFitCategory?.[category] ?? null
  }))
  const classes = RESPIRATOR_CLASSES.filter(c => c.fitCategory).map(c => ({
    key: c.key,
    label: c.label,
    fitCategory: c.fitCategory!,
    ruleSetLevel: rules.levels[c.fitCategory!],
    level: overrides.byRespiratorClass?.[c.key] ?? null
  }))
  return { ruleSet: { key: rules.key, label: rules.label, source: rules.source }, categories, classes }
}

/** Refuses a level below the rule set, the message beside the field it belongs to. */
export function checkedOverrides(org: Pick<Organization, 'ruleSet'>, overrides: PassLevelOverrides): PassLevelOverrides {
  const checked = validatePassLevelOverrides(ruleSetOf(org).key, overrides)
  if (!checked.ok) {
    const fieldErrors: Record<string, string> = {}
    for (const issue of checked.issues) fieldErrors[issue.field ?? '_'] ??= `${issue.message}.`
    throw httpError(400, `Check the pass levels: ${Object.values(fieldErrors)[0]}`, { fieldErrors })
  }
  return overrides
}
