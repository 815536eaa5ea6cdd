/** The organization's exposure assessments (signed off, and drafts), with how many assigned people have a gap. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-program')
  const [rows, gaps, sites] = await Promise.all([
    listAssessments(caller.organizationId),
    protectionGaps(caller.organizationId, await programToday(caller.organizationId)),
    listSites(caller.organizationId)
  ])
  const siteNames = new Map(sites.map(s => [s.id, s.name]))
  return rows.map(r => ({
    ...r,
    siteName: r.siteId ? siteNames.get(r.siteId) ?? null : null,
    gaps: gaps.filter(g => g.assessmentId === r.id).length
  }))
})
