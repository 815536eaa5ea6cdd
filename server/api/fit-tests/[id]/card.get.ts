import { idParamSchema } from '#shared/utils/user-schemas'

/** The wearer's fit card (PDF) for a finished, passing revision that the program accepts. */
export default defineEventHandler(async (event) => {
  const caller = await requireRole(event, 'read-fit-tests')
  const { id } = parseParams(event, idParamSchema)
  const row = await findFitTest(caller.organizationId, id)
  await assertMayRead(caller, row)
  const view = await fitTestView(caller, row)
  if (!view.card.issue) throw httpError(409, view.card.message, { reason: view.card.reason })
  // A passing revision finished before cards were kept per revision gets its own token now.
  const token = view.cardToken ?? await useDb().transaction(async (tx) => {
    await ensureCard(tx, caller.organizationId, row)
    return (await findCard(caller.organizationId, row))!.token
  })
  const pdf = await renderFitCard({ ...view, cardToken: token })
  setResponseHeader(event, 'Content-Type', 'application/pdf')
  setResponseHeader(event, 'Content-Disposition', `inline; filename="fit-card-${(view.person?.fullName ?? 'wearer').replace(/[^\w-]+/g, '-').toLowerCase()}.pdf"`)
  return pdf
})
