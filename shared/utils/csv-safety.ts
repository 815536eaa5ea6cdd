/**
 * Text that a spreadsheet would run as a formula when it opens a CSV: a cell beginning with
 * `=`, `+`, `-`, `@`, a tab or a carriage return (common practice (no published source); the
 * characters spreadsheet programs treat as the start of a formula). Such a cell gets a leading
 * apostrophe, which the spreadsheet shows as text. Numbers are written as numbers and untouched.
 */
const FORMULA_START = /^[=+\-@\t\r]/

export function neutraliseCsvCell(value: string | number | null | undefined): string | number {
  if (value === null || value === undefined) return ''
  if (typeof value === 'number') return Number.isFinite(value) ? value : ''
  return FORMULA_START.test(value) ? `'${value}` : value
}

/** Every cell of every row, neutralised. */
export function neutraliseCsvRows(rows: readonly Record<string, string | number | null | undefined>[]): Record<string, string | number>[] {
  return rows.map(row => Object.fromEntries(Object.entries(row).map(([key, value]) => [key, neutraliseCsvCell(value)])))
}
