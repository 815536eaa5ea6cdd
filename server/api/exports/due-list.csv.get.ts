import Papa from 'papaparse'
import { dueListQuerySchema } from '#shared/utils/oversight-schemas'
import { DUE_REASON_LABELS } from '#shared/utils/status-labels'

/** The due list as CSV, one line per person and item. Cells that a spreadsheet would run as a formula are neutralised. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'export')
  const q = parseQuery(event, dueListQuerySchema)
  const today = await programToday(caller.organizationId)
  const rows = await dueList(caller.organizationId, today, q)
  const safe = (v: string | null) => v && /^[=+\-@\t\r]/.test(v) ? `'${v}` : v ?? ''
  const lines = rows.flatMap(r => r.items.map(i => ({
    site: safe(r.siteName), person: safe(r.fullName), employee_number: safe(r.employeeNumber), item: safe(i.label),
    reason: DUE_REASON_LABELS[i.reason], due_on: i.dueOn ?? '', email_reminders: r.reminderOptOut ? 'opted out' : r.email ? 'yes' : 'no address'
  })))
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="due-list-${today}.csv"`)
  const fields = ['site', 'person', 'employee_number', 'item', 'reason', 'due_on', 'email_reminders'] as const
  return Papa.unparse({ fields: [...fields], data: lines.map(l => fields.map(f => l[f])) })
})
