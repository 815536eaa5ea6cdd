import { RESPIRATOR_CLASSES } from '#shared/utils/compute'
import { importClearanceRowSchema, importRowsSchema } from '#shared/utils/oversight-schemas'

/**
 * Imports medical clearance records (dates, who cleared, classes, restrictions; no medical detail).
 * Classes are separated by ";" and written as keys or labels. Re-importing a row adds nothing.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { rows, firstRow = 2 } = await parseBody(event, importRowsSchema)
  const parsed = rows.map(raw => importClearanceRowSchema.safeParse(raw))
  const personByNumber = await personIdsByEmployeeNumber(caller.organizationId, parsed.flatMap(r => r.success ? [r.data.employeeNumber] : []))
  const classByName = new Map(RESPIRATOR_CLASSES.flatMap(c => [[c.key, c.key], [c.label.toLowerCase(), c.key]]))
  const { errors, good } = sortImportRows(parsed, firstRow, (r, messages): typeof schema.medicalClearances.$inferInsert | undefined => {
    const personId = personByNumber.get(r.employeeNumber)
    if (!personId) messages.push(`Employee number ${r.employeeNumber} is not on the roster.`)
    const names = r.respiratorClasses.split(';').map(s => s.trim().toLowerCase()).filter(Boolean)
    const classes = names.map(n => classByName.get(n))
    if (!names.length) messages.push('Respirator classes: name at least one, separated by ";".')
    const unknown = names.filter((_, k) => !classes[k])
    if (unknown.length) messages.push(`Respirator class "${unknown[0]}" is not one we know: use ${RESPIRATOR_CLASSES.map(c => c.key).join(', ')}.`)
    if (r.validUntil && r.validUntil < r.clearedOn) messages.push('Valid until: cannot be before the clearance date.')
    if (messages.length) return undefined
    const respiratorClasses = [...new Set(classes as string[])].sort()
    const importKey = importKeyOf([personId, r.clearedOn, r.validUntil, r.clearedBy, respiratorClasses.join(','), r.restrictions])
    return { organizationId: caller.organizationId, personId: personId!, clearedOn: r.clearedOn, validUntil: r.validUntil ?? null, clearedBy: r.clearedBy, respiratorClasses, restrictions: r.restrictions || null, importKey, recordedByUserId: caller.id }
  })
  const added = await useDb().transaction(async (tx) => {
    const inserted = good.length ? await tx.insert(schema.medicalClearances).values(good).onConflictDoNothing().returning({ id: schema.medicalClearances.id }) : []
    await writeAudit(tx, caller, { entityType: 'medical-clearance', entityId: 'import', action: 'imported', after: { added: inserted.length, alreadyThere: good.length - inserted.length, rejected: errors.length } })
    return inserted.length
  })
  return { added, alreadyThere: good.length - added, errors }
})
