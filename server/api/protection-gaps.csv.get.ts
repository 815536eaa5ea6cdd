import Papa from 'papaparse'

/** The protection gaps as CSV, one row per person and assessment. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'review')
  const today = await programToday(caller.organizationId)
  const gaps = await protectionGaps(caller.organizationId, today)
  const csv = Papa.unparse({
    fields: ['person', 'job title', 'assessment', 'assessment signed off', 'gap', 'as of'],
    data: gaps.map(g => [g.fullName, g.jobTitle ?? '', g.assessmentTitle, g.signedOff ? 'yes' : 'no (draft)', g.gap, today])
  }, { escapeFormulae: true })
  setHeader(event, 'Content-Type', 'text/csv; charset=utf-8')
  setHeader(event, 'Content-Disposition', `attachment; filename="protection-gaps-${today}.csv"`)
  return csv
})
