import { and, eq, inArray, sql } from 'drizzle-orm'
import { importPeopleSchema, importPersonRowSchema } from '#shared/utils/person-schemas'
import { fieldErrorsOf } from '../../utils/validation'

/**
 * Imports a batch of roster rows. Each row is checked on its own: good rows are saved (a known
 * employee number updates that person), bad ones come back with their row number and messages.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { rows } = await parseBody(event, importPeopleSchema)
  const firstRowAsked = Number(getQuery(event).firstRow ?? 2)
  const firstRow = Number.isSafeInteger(firstRowAsked) && firstRowAsked >= 1 ? firstRowAsked : 2
  const sites = await listSites(caller.organizationId)
  const siteByName = new Map(sites.map(s => [s.name.toLowerCase(), s.id]))
  const errors: { row: number, messages: string[] }[] = []
  const good: (typeof schema.people.$inferInsert)[] = []
  rows.forEach((raw, i) => {
    const parsed = importPersonRowSchema.safeParse(raw)
    if (!parsed.success) return errors.push({ row: firstRow + i, messages: Object.entries(fieldErrorsOf(parsed.error)).map(([f, m]) => `${f}: ${m}`) })
    const { siteName, ...person } = parsed.data
    const siteId = siteName ? siteByName.get(siteName.toLowerCase()) : null
    if (siteName && !siteId) return errors.push({ row: firstRow + i, messages: [`site: "${siteName}" is not one of your sites (${sites.map(s => s.name).join(', ')}).`] })
    good.push({ ...person, siteId: siteId ?? null, organizationId: caller.organizationId })
  })
  const p = schema.people
  const numbers = good.map(g => g.employeeNumber).filter((n): n is string => Boolean(n))
  let created = 0
  let updated = 0
  await useDb().transaction(async (tx) => {
    // One import per organization at a time, and the roster read under that lock: the same file
    // sent twice at once then reads as it does sent twice in a row (created, then updated).
    await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${`people-import:${caller.organizationId}`}, 0))`)
    const known = numbers.length
      ? new Map((await tx.select({ id: p.id, employeeNumber: p.employeeNumber }).from(p).where(and(eq(p.organizationId, caller.organizationId), inArray(p.employeeNumber, numbers)))).map(r => [r.employeeNumber, r.id]))
      : new Map<string | null, string>()
    for (const person of good) {
      const id = person.employeeNumber ? known.get(person.employeeNumber) : undefined
      if (id) {
        await tx.update(p).set(person).where(eq(p.id, id))
        updated++
      } else {
        const [row] = await tx.insert(p).values(person).returning({ id: p.id })
        if (person.employeeNumber) known.set(person.employeeNumber, row!.id)
        created++
      }
    }
    await writeAudit(tx, caller, { entityType: 'person', entityId: 'import', action: 'imported', after: { created, updated, rejected: errors.length } })
  })
  return { created, updated, errors }
})
