import Papa from 'papaparse'
import { importPersonRowSchema } from '#shared/utils/person-schemas'

/** Our roster CSV columns (header names, any case) → the fields of a person. */
export const ROSTER_COLUMNS = {
  name: 'fullName',
  employee_number: 'employeeNumber',
  site: 'siteName',
  job: 'jobTitle',
  email: 'email',
  medical_clearance_date: 'medicalClearanceOn',
  medical_clearance_status: 'medicalClearanceStatus',
  notes: 'notes'
} as const

export interface RosterRow {
  line: number
  values: Record<string, string>
  messages: string[]
}

/** Reads a roster CSV and checks every row with the same rules the server applies. */
export function readRosterCsv(text: string, siteNames: string[]): { rows: RosterRow[], problems: string[] } {
  const parsed = Papa.parse<Record<string, string>>(text.trim(), { header: true, skipEmptyLines: 'greedy', transformHeader: h => h.trim().toLowerCase().replace(/[\s-]+/g, '_') })
  const problems: string[] = []
  const headers = parsed.meta.fields ?? []
  const unknown = headers.filter(h => !(h in ROSTER_COLUMNS))
  if (!headers.includes('name')) problems.push('The first line must name the columns, and one of them must be "name".')
  if (unknown.length) problems.push(`These columns are not read: ${unknown.join(', ')}. Known columns: ${Object.keys(ROSTER_COLUMNS).join(', ')}.`)
  const sites = new Set(siteNames.map(s => s.toLowerCase()))
  const rows = parsed.data.map((raw, i) => {
    const values: Record<string, string> = {}
    for (const [column, field] of Object.entries(ROSTER_COLUMNS)) {
      const v = raw[column]?.trim()
      if (v) values[field] = v
    }
    if (values.medicalClearanceStatus) values.medicalClearanceStatus = values.medicalClearanceStatus.toLowerCase().replace(/\s+/g, '-')
    const checked = importPersonRowSchema.safeParse(values)
    const messages = checked.success ? [] : checked.error.issues.map(issue => `${String(issue.path[0] ?? 'row')}: ${issue.message}`)
    if (values.siteName && !sites.has(values.siteName.toLowerCase())) messages.push(`site: "${values.siteName}" is not one of your sites.`)
    return { line: i + 2, values, messages }
  })
  return { rows, problems }
}
