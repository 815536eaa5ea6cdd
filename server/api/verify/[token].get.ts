import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { localDate } from '#shared/utils/fit-test-evaluate'

const paramsSchema = z.object({ token: z.string().min(20).max(100) })

function initials(name: string) {
  return name.split(/\s+/).filter(Boolean).map(part => `${part[0]!.toUpperCase()}.`).join(' ')
}

/** Public: what a fit card's QR code opens. Only initials, respirator, size, dates and the state. */
export default defineEventHandler(async (event) => {
  const { token } = parseParams(event, paramsSchema)
  const [card] = await useDb().select().from(schema.fitCards).where(eq(schema.fitCards.token, token))
  const current = card ? await currentRevision(card.organizationId, card.recordId) : null
  if (!card || !current) throw httpError(404, 'This card is not known. It may have been copied wrongly.')
  const [person] = await useDb().select({ fullName: schema.people.fullName }).from(schema.people).where(eq(schema.people.id, current.personId))
  const site = await findSite(card.organizationId, current.siteId)
  const today = localDate(new Date(), site.timeZone)
  const state = current.status !== 'finished' || !current.passed
    ? 'withdrawn'
    : current.dueOn && current.dueOn < today ? 'expired' : 'valid'
  setResponseHeader(event, 'Cache-Control', 'no-store')
  return {
    state,
    initials: initials(person?.fullName ?? ''),
    respirator: `${current.respiratorMake} ${current.respiratorModel}`,
    size: current.respiratorSize,
    testedOn: localDate(current.performedAt, site.timeZone),
    dueOn: current.dueOn,
    checkedOn: today
  }
})
