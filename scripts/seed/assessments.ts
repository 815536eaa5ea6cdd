// Demo exposure assessments: a few signed-off jobs per organization, each assigned by job title
// so that some people show a protection gap. Substances other than 2-butanone, all figures and
// every source line are invented for the demo.
import { randomUUID } from 'node:crypto'
import type { PassLevelRuleSetKey } from '../../shared/utils/compute'
import { evaluateExposureAssessment } from '../../shared/utils/compute/exposure-assessment'
import type { AssessmentStoredInput } from '../../shared/utils/exposure-schemas'
import type { SeedDb, SeededOrganization } from './db'
import { schema } from './db'

interface DemoAssessment {
  title: string
  siteIndex: number | null
  input: AssessmentStoredInput
  chosenClassKeys: string[]
  rationale: string
  signedOff: boolean
  jobTitles: string[]
}

const DEMO_LIMIT = 'demo figure (invented for the demo)'

const ASSESSMENTS: Record<string, DemoAssessment[]> = {
  'tamsin-valley': [
    {
      title: 'Pump overhaul with solvent degreasing',
      siteIndex: 1,
      input: {
        additiveMixture: true,
        oxygenDeficient: false,
        contaminants: [
          { name: '2-butanone', form: 'gas-vapour', molecularWeight: 72.11, exposure: { mode: 'segments', unit: 'ppm', segments: [{ concentration: 3000, hours: 2 }, { concentration: 1500, hours: 2 }, { concentration: 800, hours: 4 }] }, limit: { value: 590, unit: 'mg/m3', kind: 'twa-8h', source: '29 CFR 1910.1000 Table Z-1 (200 ppm, 590 mg/m³)' }, idlh: null },
          { name: 'Degreaser solvent D-4', form: 'gas-vapour', molecularWeight: null, exposure: { mode: 'single', value: 450, unit: 'ppm' }, limit: { value: 100, unit: 'ppm', kind: 'twa-8h', source: DEMO_LIMIT }, idlh: 2000 }
        ]
      },
      chosenClassKeys: ['elastomeric-full-facepiece'],
      rationale: 'Mixture index above 10: a half mask is not enough. Full facepiece with organic-vapour cartridges on a written change schedule.',
      signedOff: true,
      jobTitles: ['Maintenance fitter']
    },
    {
      title: 'Laboratory reagent preparation',
      siteIndex: 0,
      input: {
        additiveMixture: false,
        oxygenDeficient: false,
        contaminants: [
          { name: 'Reagent vapour R-2', form: 'gas-vapour', molecularWeight: null, exposure: { mode: 'single', value: 12, unit: 'ppm' }, limit: { value: 5, unit: 'ppm', kind: 'twa-8h', source: DEMO_LIMIT }, idlh: null }
        ]
      },
      chosenClassKeys: ['elastomeric-half-mask'],
      rationale: 'Hazard ratio 2.4 while the fume cupboard is being replaced; elastomeric half mask until the new extraction is commissioned.',
      signedOff: true,
      jobTitles: ['Laboratory technician']
    },
    {
      title: 'Sludge press hall (draft, awaiting second sampling day)',
      siteIndex: 0,
      input: {
        additiveMixture: false,
        oxygenDeficient: false,
        contaminants: [
          { name: 'Process dust P-7', form: 'particulate', molecularWeight: null, exposure: { mode: 'single', value: 28, unit: 'mg/m3' }, limit: { value: 5, unit: 'mg/m3', kind: 'twa-8h', source: DEMO_LIMIT }, idlh: null }
        ]
      },
      chosenClassKeys: [],
      rationale: '',
      signedOff: false,
      jobTitles: []
    }
  ],
  'harrow-point': [
    {
      title: 'Post-fire overhaul and damping down',
      siteIndex: 0,
      input: {
        additiveMixture: false,
        oxygenDeficient: false,
        contaminants: [
          { name: 'Fire residue dust', form: 'particulate', molecularWeight: null, exposure: { mode: 'single', value: 30, unit: 'mg/m3' }, limit: { value: 1, unit: 'mg/m3', kind: 'twa-8h', source: DEMO_LIMIT }, idlh: null }
        ]
      },
      chosenClassKeys: ['uk-full-face-p3'],
      rationale: 'Required protection factor 30: FFP3 and half masks (20) fall short; full face mask with P3 filter.',
      signedOff: true,
      jobTitles: ['Firefighter']
    },
    {
      title: 'Confined-space entry, atmosphere not yet proven',
      siteIndex: null,
      input: {
        additiveMixture: false,
        oxygenDeficient: true,
        contaminants: [
          { name: 'Unknown vapour', form: 'gas-vapour', molecularWeight: null, exposure: { mode: 'single', value: 40, unit: 'ppm' }, limit: { value: 10, unit: 'ppm', kind: 'twa-8h', source: DEMO_LIMIT }, idlh: null }
        ]
      },
      chosenClassKeys: ['uk-scba-positive-pressure'],
      rationale: 'Oxygen may be deficient: breathing apparatus only, whatever the measured ratio.',
      signedOff: true,
      jobTitles: ['Hazmat officer']
    }
  ]
}

export async function seedAssessments(db: SeedDb, orgs: SeededOrganization[]) {
  for (const org of orgs) {
    const list = ASSESSMENTS[org.slug] ?? []
    const [orgRow] = (await db.select().from(schema.organizations)).filter(o => o.id === org.id)
    const ruleSet = (orgRow?.ruleSet === 'uk-hse' ? 'uk-hse' : 'us-osha') as PassLevelRuleSetKey
    const reviewer = org.userIds.reviewer!
    for (const demo of list) {
      const result = evaluateExposureAssessment({ ruleSet, ...demo.input })
      if (!result.ok) throw new Error(`Demo assessment "${demo.title}" does not compute: ${result.issues[0]?.message}`)
      const recordId = randomUUID()
      await db.insert(schema.exposureAssessments).values({
        organizationId: org.id, recordId, title: demo.title, siteId: demo.siteIndex === null ? null : org.siteIds[demo.siteIndex] ?? null, ruleSet,
        input: demo.input, chosenClassKeys: demo.chosenClassKeys, rationale: demo.rationale,
        requiredProtectionFactor: result.value.requiredProtectionFactor, idlhAtmosphere: result.value.idlhAtmosphere,
        status: demo.signedOff ? 'signed-off' : 'draft', createdByUserId: reviewer,
        signedOffByUserId: demo.signedOff ? reviewer : null, signedOffAt: demo.signedOff ? new Date(Date.now() - 14 * 86400000) : null
      })
      if (demo.jobTitles.length) {
        await db.insert(schema.exposureAssignments).values(demo.jobTitles.map(jobTitle => ({ organizationId: org.id, recordId, jobTitle, createdByUserId: reviewer })))
      }
    }
  }
}
