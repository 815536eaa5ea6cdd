// Demo oversight data: e-mail addresses on the roster, medical clearance records (some lapsing or
// lapsed), a second respirator for a few people, and imported history. Everything is invented.
import { createHash } from 'node:crypto'
import { and, eq } from 'drizzle-orm'
import { nextDueDate } from '../../shared/utils/fit-test-evaluate'
import type { SeedDb, SeededOrganization } from './db'
import { schema } from './db'

function day(offsetDays: number) {
  return new Date(Date.now() + offsetDays * 86400_000).toISOString().slice(0, 10)
}

export async function seedOversight(db: SeedDb, orgs: SeededOrganization[]) {
  for (const org of orgs) {
    const people = await db.select().from(schema.people).where(eq(schema.people.organizationId, org.id)).orderBy(schema.people.employeeNumber)
    const models = await db.select().from(schema.respiratorModels).where(eq(schema.respiratorModels.organizationId, org.id))
    const tests = await db.select({ personId: schema.fitTests.personId, respiratorModelId: schema.fitTests.respiratorModelId, respiratorClass: schema.fitTests.respiratorClass })
      .from(schema.fitTests).where(and(eq(schema.fitTests.organizationId, org.id), eq(schema.fitTests.status, 'finished')))
    for (const [i, person] of people.entries()) {
      const [first, last] = person.fullName.toLowerCase().split(' ')
      if (i > 0 && !person.email) await db.update(schema.people).set({ email: `${first}.${last}.${i}@${org.slug}.example` }).where(eq(schema.people.id, person.id))
      const classes = [...new Set(tests.filter(t => t.personId === person.id).map(t => t.respiratorClass))]
      if (i % 13 === 5 || !classes.length) continue
      // Most clearances run a year from a date in the past year; every ninth has lapsed, every eleventh ends soon.
      const clearedOn = i % 9 === 4 ? day(-400) : i % 11 === 3 ? day(-350) : day(-30 - (i * 7) % 300)
      const validUntil = nextDueDate(clearedOn, 12)
      await db.insert(schema.medicalClearances).values({ organizationId: org.id, personId: person.id, clearedOn, validUntil, clearedBy: 'Example Occupational Health Clinic', respiratorClasses: [...classes, 'filtering-facepiece'], restrictions: i % 7 === 2 ? 'No continuous wear over 4 hours' : null, importKey: `demo-${person.id}` }).onConflictDoNothing()
    }
    // Person 1 also wears a second model, fitted before Sealwright (imported history); person 2 is assigned one never tested.
    for (const [index, imported] of [[1, true], [2, false]] as const) {
      const person = people[index]
      if (!person) continue
      const used = new Set(tests.filter(t => t.personId === person.id).map(t => t.respiratorModelId))
      const other = models.find(m => !used.has(m.id))
      if (!other) continue
      await db.insert(schema.respiratorAssignments).values({ organizationId: org.id, personId: person.id, respiratorModelId: other.id }).onConflictDoNothing()
      if (!imported) continue
      const testedOn = day(-200)
      await db.insert(schema.fitHistoryEntries).values({
        organizationId: org.id, personId: person.id, testedOn, respiratorModelId: other.id, respiratorMake: other.make, respiratorModel: other.model,
        respiratorClass: other.respiratorClass, respiratorSize: other.sizes[0]!, passed: 'pass', overallFitFactor: null, testerName: 'Former contractor (example)',
        dueOn: nextDueDate(testedOn, 12), importKey: createHash('sha256').update(`demo|${person.id}|${other.id}`).digest('hex')
      }).onConflictDoNothing()
    }
  }
}
