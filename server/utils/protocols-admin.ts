import { BUILT_IN_PROTOCOLS, findBuiltInProtocol } from '#shared/utils/compute'
import type { Protocol } from '#shared/utils/compute'

type Organization = OrganizationRow

/** The organization's own protocols, added by an admin. */
export function customProtocolsOf(org: Pick<Organization, 'settings'>): Protocol[] {
  return org.settings.customProtocols ?? []
}

/** Every protocol a tester may choose: the built-in ones, then the organization's own. */
export function protocolsOffered(org: Pick<Organization, 'settings'>): Protocol[] {
  return [...BUILT_IN_PROTOCOLS, ...customProtocolsOf(org)]
}

export function findOfferedProtocol(org: Pick<Organization, 'settings'>, key: string): Protocol | undefined {
  return findBuiltInProtocol(key) ?? customProtocolsOf(org).find(p => p.key === key)
}
