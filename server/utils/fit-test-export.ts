import { PASS_LEVEL_RULE_SETS, findBuiltInProtocol } from '#shared/utils/compute'
import type { PassLevelRuleSetKey, Protocol } from '#shared/utils/compute'
import { evaluateFitTest } from '#shared/utils/fit-test-evaluate'

type ExportRow = Awaited<ReturnType<typeof exportFitTests>>[number]
type Reviews = Awaited<ReturnType<typeof reviewsOf>>

/** The review columns of one record: its countersign (this revision only) and its queries. */
function reviewCells(fitTestId: string, reviews: Reviews) {
  const countersign = reviews.countersigns.find(c => c.fitTestId === fitTestId)
  const queries = reviews.queries.filter(q => q.fitTestId === fitTestId)
  return {
    'countersigned by': countersign?.signedBy ?? '',
    'countersigned at (UTC)': countersign ? countersign.signedAt.toISOString() : '',
    'countersign comment': countersign?.comment ?? '',
    'open queries': queries.filter(q => q.status === 'open').length,
    'answered queries': queries.filter(q => q.status !== 'open').length
  }
}

/**
 * What the result column says. Only a finished record can say pass or fail: a withdrawn record
 * says withdrawn whatever its numbers were, a draft says draft.
 */
export function exportResultWord(row: Pick<ExportRow, 'status' | 'passed'>): string {
  if (row.status === 'draft') return 'draft'
  if (row.status === 'withdrawn') return 'withdrawn'
  if (row.status === 'superseded') return 'superseded'
  if (row.passed === null) return ''
  return row.passed ? 'pass' : 'fail'
}

const round = (value: number | null | undefined, digits = 3) => (value === null || value === undefined || !Number.isFinite(value) ? '' : Number(value.toFixed(digits)))

/**
 * One line per record: every 29 CFR 1910.134(m)(2) field held, the record's status, and each
 * exercise's concentrations and fit factor recomputed from the raw inputs (nothing the client
 * computed). Exercise columns are numbered in protocol order, so records of different protocols
 * share columns; the exercise's name is in its own column. A countersign belongs to one revision:
 * a correction shows none until it is countersigned afresh.
 */
export function fitTestExportLines(rows: ExportRow[], ruleSet: string, reviews: Reviews = { countersigns: [], queries: [] }) {
  const rules = PASS_LEVEL_RULE_SETS[ruleSet as PassLevelRuleSetKey]
  const evaluated = rows.map((r) => {
    const protocol = r.protocol as Protocol | null
    if (r.kind !== 'quantitative' || !protocol || r.passLevel === null) return null
    return evaluateFitTest({ protocol, entry: r.entry, seriesText: r.seriesText, passLevel: r.passLevel, sampleFlowCm3PerMin: r.sampleFlowCm3PerMin }).result
  })
  const slots = Math.max(0, ...rows.map(r => (r.protocol as Protocol | null)?.exercises.length ?? 0))
  return rows.map((r, index) => {
    const result = evaluated[index]
    const protocol = r.protocol as Protocol | null
    const line: Record<string, string | number | null> = {
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
      'protocol': protocol?.name ?? findBuiltInProtocol(r.protocolKey)?.name ?? r.protocolKey,
      'counter': r.counterSerial ?? '',
      'counter readiness': r.coverage ? (r.coverage.covered ? 'covered' : `NOT COVERED: ${r.coverage.message}`) : '',
      'overall fit factor': r.overallFitFactor === null ? '' : `${r.overallIsLowerBound ? '>' : ''}${r.overallFitFactor.toFixed(1)}`,
      'pass level': r.passLevel ?? '',
      'rule set': rules ? `${rules.label}, ${rules.source}` : ruleSet,
      'result': exportResultWord(r),
      'limiting exercise': r.limitingExerciseKey ?? '',
      'next due': r.status === 'finished' ? r.dueOn ?? '' : '',
      'tester': r.testerName,
      ...reviewCells(r.id, reviews)
    }
    for (let i = 0; i < slots; i++) {
      const exercise = protocol?.exercises[i]
      const typed = exercise && r.entry.mode === 'grid' ? r.entry.exercises.find(e => e.exerciseKey === exercise.key) : undefined
      const computed = exercise ? result?.exercises.find(e => e.exerciseKey === exercise.key) : undefined
      const n = i + 1
      line[`exercise ${n}`] = exercise ? `${exercise.name}${exercise.counted ? '' : ' (not counted)'}` : ''
      line[`exercise ${n} ambient before (/cm³)`] = round(typed?.ambientBefore)
      line[`exercise ${n} ambient after (/cm³)`] = round(typed?.ambientAfter)
      line[`exercise ${n} ambient used (/cm³)`] = round(computed?.ambient)
      line[`exercise ${n} in-mask (/cm³)`] = round(computed?.inMask ?? typed?.inMask)
      line[`exercise ${n} in-mask count`] = typed?.inMaskCount ?? ''
      line[`exercise ${n} fit factor`] = computed?.fitFactor ? `${computed.fitFactor.isLowerBound ? '>' : ''}${computed.fitFactor.value.toFixed(1)}` : ''
    }
    return line
  })
}
