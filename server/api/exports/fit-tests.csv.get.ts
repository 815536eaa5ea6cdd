import Papa from 'papaparse'
import { neutraliseCsvRows } from '#shared/utils/csv-safety'
import { listFitTestsQuerySchema } from '#shared/utils/fit-test-schemas'

/**
 * The tests matching the list's filters, one line per record, every (m)(2) field we hold with
 * each exercise's concentrations and fit factor. No cell can run as a spreadsheet formula.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'export')
  const query = parseQuery(event, listFitTestsQuerySchema)
  const [rows, org] = await Promise.all([exportFitTests(caller.organizationId, query), findOrganization(caller.organizationId)])
  const reviews = await reviewsOf(caller.organizationId, rows.map(r => r.id))
  const csv = Papa.unparse(neutraliseCsvRows(fitTestExportLines(rows, org.ruleSet, reviews)), { escapeFormulae: false })
  setResponseHeader(event, 'Content-Type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'Content-Disposition', `attachment; filename="fit-tests-${new Date().toISOString().slice(0, 10)}.csv"`)
  return csv
})
