import { eq } from 'drizzle-orm'
import { readTypedNumber } from '#shared/utils/number-reader'
import { importedDueOn } from '#shared/utils/oversight'
import { importHistoryRowSchema, importRowsSchema } from '#shared/utils/oversight-schemas'

/**
 * Imports fit tests done before Sealwright. Each row names a person by employee number and a
 * catalogue respirator by make and model; it becomes an "imported history" entry that counts for
 * due dates and status. Importing the same row again adds nothing (a natural key per row).
 */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'record')
  const { rows, firstRow = 2 } = await parseBody(event, importRowsSchema)
  const org = await findOrganization(caller.organizationId)
  const decimalMark = decimalMarkOf(org)
  const models = await useDb().select().from(schema.respiratorModels).where(eq(schema.respiratorModels.organizationId, caller.organizationId))
  const modelByName = new Map(models.map(m => [`${m.make} ${m.model}`.toLowerCase(), m]))
  const parsed = rows.map(raw => importHistoryRowSchema.safeParse(raw))
  const personByNumber = await personIdsByEmployeeNumber(caller.organizationId, parsed.flatMap(r => r.success ? [r.data.employeeNumber] : []))
  const { errors, good } = sortImportRows(parsed, firstRow, (r, messages): typeof schema.fitHistoryEntries.$inferInsert | undefined => {
    const personId = personByNumber.get(r.employeeNumber)
    if (!personId) messages.push(`Employee number ${r.employeeNumber} is not on the roster: import the person first.`)
    const model = modelByName.get(r.respirator.toLowerCase())
    if (!model) messages.push(`Respirator "${r.respirator}" is not in your catalogue: write its make and model as the catalogue does.`)
    else if (!model.sizes.includes(r.size)) messages.push(`${model.make} ${model.model} comes in ${model.sizes.join(', ')}, not "${r.size}".`)
    let overallFitFactor: number | null = null
    if (r.overallFitFactor) {
      const reading = readTypedNumber(r.overallFitFactor, { decimalMark })
      if (!reading.ok) messages.push(`Overall fit factor: ${reading.message}`)
      else if (reading.value <= 0) messages.push('Overall fit factor: must be above 0.')
      else overallFitFactor = reading.value
    }
    if (r.testedOn > todayUtc()) messages.push('Last test date: is in the future.')
    if (messages.length) return undefined
    const key = importKeyOf([personId, r.testedOn, model!.id, r.size, r.result, overallFitFactor])
    return {
      organizationId: caller.organizationId, personId: personId!, testedOn: r.testedOn, respiratorModelId: model!.id, respiratorMake: model!.make,
      respiratorModel: model!.model, respiratorClass: model!.respiratorClass, respiratorSize: r.size, passed: r.result, overallFitFactor,
      testerName: r.tester || null, dueOn: importedDueOn(r.testedOn, r.result === 'pass', org.settings.retestIntervalMonths), importKey: key, importedByUserId: caller.id
    }
  })
  const added = await useDb().transaction(async (tx) => {
    const inserted = good.length ? await tx.insert(schema.fitHistoryEntries).values(good).onConflictDoNothing().returning({ id: schema.fitHistoryEntries.id }) : []
    await writeAudit(tx, caller, { entityType: 'fit-history', entityId: 'import', action: 'imported', after: { added: inserted.length, alreadyThere: good.length - inserted.length, rejected: errors.length } })
    return inserted.length
  })
  return { added, alreadyThere: good.length - added, errors }
})
