import type { DecimalMark } from '#shared/utils/number-reader'

type Organization = OrganizationRow

/** The organization's decimal mark; point until an admin chooses a comma (DOMAIN.md "Typing numbers"). */
export function decimalMarkOf(org: Pick<Organization, 'settings'>): DecimalMark {
  return org.settings.decimalMark === 'comma' ? 'comma' : 'point'
}

/** The program settings as the settings page shows them, with their defaults filled in. */
export function settingsView(org: Pick<Organization, 'settings' | 'ruleSet'>) {
  return {
    uncoveredResults: org.settings.uncoveredResults ?? 'flag',
    decimalMark: decimalMarkOf(org),
    ruleSet: org.ruleSet
  }
}
