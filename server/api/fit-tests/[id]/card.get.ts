import { idParamSchema } from '#shared/utils/user-schemas'

export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'tester', 'reviewer', 'trainer', 'wearer')
  const { id } = parseParams(event, idParamSchema)
  const row = await findFitTest(caller.organizationId, id)
  await assertMayRead(caller, row)
  if (row.status !== 'finished' || !row.passed) {
    throw httpError(409, row.status === 'finished' ? 'There is no fit card for a test that did not pass.' : 'A fit card is issued once a passing test is finished.')
  }
  const view = await fitTestView(caller, row)
  const pdf = await renderFitCard(view)
  setResponseHeader(event, 'Content-Type', 'application/pdf')
  setResponseHeader(event, 'Content-Disposition', `inline; filename="fit-card-${(view.person?.fullName ?? 'wearer').replace(/[^\w-]+/g, '-').toLowerCase()}.pdf"`)
  return pdf
})
