import { and, asc, eq } from 'drizzle-orm'

export async function listRespiratorModels(organizationId: string, { includeRetired = false } = {}) {
  const r = schema.respiratorModels
  const rows = await useDb().select().from(r)
    .where(and(eq(r.organizationId, organizationId), includeRetired ? undefined : eq(r.active, true)))
    .orderBy(asc(r.make), asc(r.model))
  return rows.map(respiratorModelView)
}

/** What a route sends for a catalogue entry: the fields the pages show, never the whole row. */
export function respiratorModelView(row: RespiratorModelRow) {
  return { id: row.id, make: row.make, model: row.model, respiratorClass: row.respiratorClass, sizes: row.sizes, notes: row.notes, active: row.active }
}

/** One catalogue entry of the organization, or 404. */
export async function findRespiratorModel(organizationId: string, id: string) {
  const r = schema.respiratorModels
  const [row] = await useDb().select().from(r).where(and(eq(r.organizationId, organizationId), eq(r.id, id)))
  if (!row) throw httpError(404, 'No such respirator model in your catalogue.')
  return row
}
