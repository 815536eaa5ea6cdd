import Papa from 'papaparse'
import type { z } from 'zod'
import { importClearanceRowSchema, importHistoryRowSchema } from '#shared/utils/oversight-schemas'

/** Our CSV columns for each import (header names, any case) → the fields the route reads. */
export const OVERSIGHT_IMPORTS = {
  history: {
    columns: { employee_number: 'employeeNumber', last_test_date: 'testedOn', respirator: 'respirator', size: 'size', result: 'result', overall_fit_factor: 'overallFitFactor', tester: 'tester' },
    schema: importHistoryRowSchema as z.ZodType,
    example: 'employee_number,last_test_date,respirator,size,result,overall_fit_factor,tester\n4471,2025-11-03,Corvid Safety CV-2 half mask,M,pass,1850,Pat Example'
  },
  clearances: {
    columns: { employee_number: 'employeeNumber', cleared_on: 'clearedOn', valid_until: 'validUntil', cleared_by: 'clearedBy', respirator_classes: 'respiratorClasses', restrictions: 'restrictions' },
    schema: importClearanceRowSchema as z.ZodType,
    example: 'employee_number,cleared_on,valid_until,cleared_by,respirator_classes,restrictions\n4471,2026-01-12,2027-01-12,Example Occupational Clinic,elastomeric-half-mask; elastomeric-full-facepiece,'
  }
} as const
export type OversightImportKind = keyof typeof OVERSIGHT_IMPORTS

export interface ImportRow { line: number, values: Record<string, string>, messages: string[] }

/** Reads the CSV and checks each row with the route's own schema; the server checks the rest (people, catalogue, numbers). */
export function readOversightCsv(kind: OversightImportKind, text: string): { rows: ImportRow[], problems: string[] } {
  const { columns, schema } = OVERSIGHT_IMPORTS[kind]
  const parsed = Papa.parse<Record<string, string>>(text.trim(), { header: true, skipEmptyLines: 'greedy', transformHeader: h => h.trim().toLowerCase().replace(/[\s-]+/g, '_') })
  const headers = parsed.meta.fields ?? []
  const problems: string[] = []
  const missing = Object.keys(columns).filter(c => !headers.includes(c) && !['overall_fit_factor', 'tester', 'valid_until', 'restrictions'].includes(c))
  if (missing.length) problems.push(`These columns are missing: ${missing.join(', ')}.`)
  const unknown = headers.filter(h => !(h in columns))
  if (unknown.length) problems.push(`These columns are not read: ${unknown.join(', ')}.`)
  const rows = parsed.data.map((raw, i) => {
    const values: Record<string, string> = {}
    for (const [column, field] of Object.entries(columns)) {
      const v = raw[column]?.trim()
      if (v) values[field] = v
    }
    const checked = schema.safeParse(values)
    return { line: i + 2, values, messages: checked.success ? [] : checked.error.issues.map(x => x.message) }
  })
  return { rows, problems }
}
