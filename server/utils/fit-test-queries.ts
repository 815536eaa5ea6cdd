import { randomBytes } from 'node:crypto'
import { and, asc, desc, eq } from 'drizzle-orm'
import type { FitTestRow } from './fit-tests'

// Reads and writes of fit-test rows shared by several routes; the rules they apply are in fit-tests.ts.

/** One revision of the organization, or a 404 that reads the same for "missing" and "not yours". */
export async function findFitTest(organizationId: string, id: string): Promise<FitTestRow> {
  const t = schema.fitTests
  const [row] = await useDb().select().from(t).where(and(eq(t.organizationId, organizationId), eq(t.id, id)))
  if (!row) throw httpError(404, 'No such fit test in your organization.')
  return row
}

/** Checks that every referenced row belongs to the caller's organization and fits together. */
export async function resolveReferences(organizationId: string, input: { personId: string, respiratorModelId: string, respiratorSize: string, siteId: string, counterId: string | null }) {
  const db = useDb()
  const [person] = await db.select().from(schema.people).where(and(eq(schema.people.organizationId, organizationId), eq(schema.people.id, input.personId)))
  const model = await findRespiratorModel(organizationId, input.respiratorModelId).catch(() => null)
  const [site] = await db.select().from(schema.sites).where(and(eq(schema.sites.organizationId, organizationId), eq(schema.sites.id, input.siteId)))
  const [counter] = input.counterId
    ? await db.select().from(schema.counters).where(and(eq(schema.counters.organizationId, organizationId), eq(schema.counters.id, input.counterId)))
    : [null]
  const fieldErrors: Record<string, string> = {}
  if (!person) fieldErrors.personId = 'Choose a person from your roster.'
  if (!model) fieldErrors.respiratorModelId = 'Choose a respirator from your catalogue.'
  else if (!model.sizes.includes(input.respiratorSize)) fieldErrors.respiratorSize = `${model.make} ${model.model} comes in ${model.sizes.join(', ')}.`
  if (!site) fieldErrors.siteId = 'Choose one of your sites.'
  if (input.counterId && !counter) fieldErrors.counterId = 'Choose one of your counters.'
  if (Object.keys(fieldErrors).length) {
    throw httpError(400, `Check the form: ${Object.values(fieldErrors)[0]}`, { fieldErrors })
  }
  return { person: person!, model: model!, site: site!, counter: counter ?? null }
}

/**
 * Locks every revision of a record (SELECT … FOR UPDATE, in revision order) for the rest of the
 * transaction and returns them as they are now. Withdrawing, correcting and finishing all take
 * this lock first, so of two racing changes one waits, then sees the other's result and is
 * refused with a 409 instead of acting on a state that no longer holds.
 */
export async function lockRecord(tx: Tx, organizationId: string, recordId: string): Promise<FitTestRow[]> {
  const t = schema.fitTests
  return tx.select().from(t)
    .where(and(eq(t.organizationId, organizationId), eq(t.recordId, recordId)))
    .orderBy(asc(t.revision))
    .for('update')
}

export async function findSite(organizationId: string, siteId: string) {
  const [site] = await useDb().select().from(schema.sites).where(and(eq(schema.sites.organizationId, organizationId), eq(schema.sites.id, siteId)))
  if (!site) throw httpError(404, 'No such site.')
  return site
}

export async function listRevisions(organizationId: string, recordId: string) {
  const t = schema.fitTests
  return useDb().select({ id: t.id, revision: t.revision, status: t.status, revisionReason: t.revisionReason, finishedAt: t.finishedAt, createdAt: t.createdAt })
    .from(t).where(and(eq(t.organizationId, organizationId), eq(t.recordId, recordId))).orderBy(asc(t.revision))
}

/** Gives a finished, passing revision its own card token (once). */
export async function ensureCard(tx: Tx, organizationId: string, row: Pick<FitTestRow, 'id' | 'recordId'>) {
  await tx.insert(schema.fitCards).values({ organizationId, recordId: row.recordId, fitTestId: row.id, token: randomBytes(24).toString('base64url') }).onConflictDoNothing()
}

/**
 * The card printed for this revision: its own, or — for cards made before each revision had one —
 * the record's card when this revision is the one the record stands on.
 */
export async function findCard(organizationId: string, row: Pick<FitTestRow, 'id' | 'recordId' | 'status'>) {
  const c = schema.fitCards
  const cards = await useDb().select().from(c).where(and(eq(c.organizationId, organizationId), eq(c.recordId, row.recordId)))
  const own = cards.find(card => card.fitTestId === row.id)
  if (own) return own
  const legacy = cards.find(card => card.fitTestId === null)
  if (!legacy) return null
  const current = await currentRevision(organizationId, row.recordId)
  return current?.id === row.id ? legacy : null
}

/** The revision a card stands for: its own, or for an older card the record's current revision. */
export async function cardRevision(card: typeof schema.fitCards.$inferSelect) {
  if (card.fitTestId) {
    const [row] = await useDb().select().from(schema.fitTests).where(and(eq(schema.fitTests.organizationId, card.organizationId), eq(schema.fitTests.id, card.fitTestId)))
    return row ?? null
  }
  return currentRevision(card.organizationId, card.recordId)
}

/** The revision a record stands on now: the finished (or withdrawn) one, else the newest. */
export async function currentRevision(organizationId: string, recordId: string) {
  const t = schema.fitTests
  const rows = await useDb().select().from(t).where(and(eq(t.organizationId, organizationId), eq(t.recordId, recordId))).orderBy(desc(t.revision))
  return rows.find(r => r.status === 'finished' || r.status === 'withdrawn') ?? rows[0] ?? null
}
