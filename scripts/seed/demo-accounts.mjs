// The demo scenario's sign-ins (invented people, invented organizations, .example addresses).
// Plain JavaScript so the start command can print them before anything is compiled.
export const DEMO_PASSWORD = 'sealwright-demo'

export const DEMO_ORGANIZATIONS = [
  {
    slug: 'tamsin-valley',
    name: 'Tamsin Valley Water Authority',
    ruleSet: 'us-osha',
    domain: 'tamsin-valley.example',
    sites: [
      { name: 'Brackwater Treatment Works', timeZone: 'America/Chicago', address: '12 Weir Road, Brackwater' },
      { name: 'Hollin Ridge Pumping Station', timeZone: 'America/Chicago', address: 'Hollin Ridge Lane' },
      { name: 'Upper Tamsin Filtration Plant', timeZone: 'America/Denver', address: 'Reservoir Drive, Upper Tamsin' }
    ],
    accounts: [
      { role: 'admin', displayName: 'Alma Greaves' },
      { role: 'tester', displayName: 'Teodor Lisle' },
      { role: 'reviewer', displayName: 'Nadia Kerrow' },
      { role: 'trainer', displayName: 'Owen Pryce-Hale' },
      { role: 'wearer', displayName: 'Jonah Marsh' }
    ]
  },
  {
    slug: 'harrow-point',
    name: 'Harrow Point Fire & Rescue',
    ruleSet: 'uk-hse',
    domain: 'harrow-point.example',
    sites: [
      { name: 'Quayside Station', timeZone: 'Europe/London', address: '1 Harbour Parade, Harrow Point' },
      { name: 'Gorse Lane Training Centre', timeZone: 'Europe/London', address: 'Gorse Lane, Harrow Point' }
    ],
    accounts: [
      { role: 'admin', displayName: 'Bridget Colvane' },
      { role: 'tester', displayName: 'Kwame Aldous' },
      { role: 'reviewer', displayName: 'Sunita Rhodes' },
      { role: 'trainer', displayName: 'Callum Brierley' },
      { role: 'wearer', displayName: 'Elin Moss' }
    ]
  }
]

export function demoEmail(org, role) {
  return `${role}@${org.domain}`
}

/** Rows for printing: organization, role, e-mail. */
export function demoSignIns() {
  return DEMO_ORGANIZATIONS.flatMap(org => org.accounts.map(a => ({ organization: org.name, role: a.role, email: demoEmail(org, a.role), name: a.displayName })))
}
