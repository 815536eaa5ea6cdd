import Papa from 'papaparse'
import { findBuiltInProtocol } from '#shared/utils/compute'
import { listFitTestsQuerySchema } from '#shared/utils/fit-test-schemas'

/** The tests matching the list's filters, one line per record, every (m)(2) field we hold. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'tester', 'reviewer')
  const query = parseQuery(event, listFitTestsQuerySchema)
  const rows = await exportFitTests(caller.organizationId, query)
  const csv = Papa.unparse(rows.map(r => ({
    'record': r.recordId,
    'revision': r.revision,
    'status': r.status,
    'tested at (UTC)': r.performedAt.toISOString(),
    'site': r.siteName,
    'person': r.personName,
    'employee number': r.employeeNumber ?? '',
    'test type': r.kind === 'qualitative' ? 'QLFT' : 'QNFT',
    'make': r.respiratorMake,
    'model': r.respiratorModel,
    'style': r.respiratorClass,
    'size': r.respiratorSize,
    'protocol': findBuiltInProtocol(r.protocolKey)?.name ?? r.protocolKey,
    'counter': r.counterSerial ?? '',
    'counter readiness': r.coverage ? (r.coverage.covered ? 'covered' : `NOT COVERED: ${r.coverage.message}`) : '',
    'overall fit factor': r.overallFitFactor === null ? '' : `${r.overallIsLowerBound ? '>' : ''}${r.overallFitFactor.toFixed(1)}`,
    'pass level': r.passLevel ?? '',
    'result': r.status === 'draft' ? 'draft' : r.passed === null ? '' : r.passed ? 'pass' : 'fail',
    'limiting exercise': r.limitingExerciseKey ?? '',
    'next due': r.dueOn ?? '',
    'tester': r.testerName
  })))
  setResponseHeader(event, 'Content-Type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'Content-Disposition', `attachment; filename="fit-tests-${new Date().toISOString().slice(0, 10)}.csv"`)
  return csv
})
