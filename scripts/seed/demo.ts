// Loads the invented demo scenario of DOMAIN.md. Run by `npm start` on an empty database only.
import { DEMO_ORGANIZATIONS, DEMO_PASSWORD, demoEmail } from './demo-accounts.mjs'
import type { SeedDb, SeededOrganization } from './db'
import { schema } from './db'
import { seedAssessments } from './assessments'
import { seedFitTests } from './fit-tests'
import { seedOversight } from './oversight'
import { hashPassword } from './hash'
import { seedEquipment } from './equipment'
import { seedInsights } from './insights'
import { rebuildInsightFacts } from '../../server/database/insight-facts'

export async function seedDemo(db: SeedDb, onProgress: (text: string) => void = () => {}): Promise<SeededOrganization[]> {
  const passwordHash = await hashPassword(DEMO_PASSWORD)
  const seeded: SeededOrganization[] = []
  for (const org of DEMO_ORGANIZATIONS) {
    onProgress(`${org.name}: organization, sites and accounts`)
    const result = await db.transaction(async (tx) => {
      const [row] = await tx.insert(schema.organizations).values({ name: org.name, slug: org.slug, ruleSet: org.ruleSet }).returning()
      const sites = await tx.insert(schema.sites).values(org.sites.map(s => ({ ...s, organizationId: row!.id }))).returning()
      const users = await tx.insert(schema.users).values(org.accounts.map(a => ({
        organizationId: row!.id,
        email: demoEmail(org, a.role),
        displayName: a.displayName,
        role: a.role as typeof schema.users.$inferInsert.role,
        passwordHash
      }))).returning()
      return {
        id: row!.id,
        slug: org.slug,
        siteIds: sites.map(s => s.id),
        userIds: Object.fromEntries(users.map(u => [u.role, u.id]))
      }
    })
    seeded.push(result)
  }
  await seedEquipment(db, seeded)
  await seedFitTests(db, seeded, onProgress)
  await seedInsights(db, seeded, onProgress)
  onProgress('Exposure assessments')
  await seedAssessments(db, seeded)
  await seedOversight(db, seeded)
  onProgress('Insights summary')
  await rebuildInsightFacts(db)
  return seeded
}
