import { and, asc, eq, getTableColumns } from 'drizzle-orm'

/** A site id sent by a form must name a site of the caller's organization. */
export async function assertSite(organizationId: string, siteId: string | null | undefined) {
  if (!siteId) return
  const [row] = await useDb().select({ id: schema.sites.id }).from(schema.sites)
    .where(and(eq(schema.sites.organizationId, organizationId), eq(schema.sites.id, siteId)))
  if (!row) throw httpError(400, 'Check the form: choose one of your sites.', { fieldErrors: { siteId: 'Choose one of your sites.' } })
}

/** The IANA time zone deciding a result's calendar day; UTC when no site is known. */
export async function siteTimeZone(organizationId: string, siteId: string | null | undefined): Promise<string> {
  if (!siteId) return 'UTC'
  const [row] = await useDb().select({ timeZone: schema.sites.timeZone }).from(schema.sites)
    .where(and(eq(schema.sites.organizationId, organizationId), eq(schema.sites.id, siteId)))
  return row?.timeZone ?? 'UTC'
}

export async function listCounters(organizationId: string, { includeRetired = false } = {}) {
  const c = schema.counters
  const rows = await useDb().select({ ...getTableColumns(c), siteName: schema.sites.name }).from(c)
    .leftJoin(schema.sites, eq(schema.sites.id, c.siteId))
    .where(and(eq(c.organizationId, organizationId), includeRetired ? undefined : eq(c.active, true)))
    .orderBy(asc(c.serialNumber))
  return rows.map(row => ({ ...counterView(row), siteName: row.siteName }))
}

export async function findCounter(organizationId: string, id: string) {
  const c = schema.counters
  const [row] = await useDb().select().from(c).where(and(eq(c.organizationId, organizationId), eq(c.id, id)))
  if (!row) throw httpError(404, 'No such counter in your organization.')
  return row
}

export async function listBenchRigs(organizationId: string, { includeRetired = false } = {}) {
  const r = schema.benchRigs
  const rows = await useDb().select({ ...getTableColumns(r), siteName: schema.sites.name, counterSerial: schema.counters.serialNumber }).from(r)
    .leftJoin(schema.sites, eq(schema.sites.id, r.siteId))
    .innerJoin(schema.counters, eq(schema.counters.id, r.counterId))
    .where(and(eq(r.organizationId, organizationId), includeRetired ? undefined : eq(r.active, true)))
    .orderBy(asc(r.serialNumber))
  return rows.map(row => ({ ...benchRigView(row), siteName: row.siteName, counterSerial: row.counterSerial }))
}

export async function findBenchRig(organizationId: string, id: string) {
  const r = schema.benchRigs
  const [row] = await useDb().select().from(r).where(and(eq(r.organizationId, organizationId), eq(r.id, id)))
  if (!row) throw httpError(404, 'No such bench rig in your organization.')
  return row
}

/** A rig may only be paired with an active counter of the same organization. */
export async function assertPairableCounter(organizationId: string, counterId: string) {
  const c = schema.counters
  const [row] = await useDb().select({ active: c.active }).from(c).where(and(eq(c.organizationId, organizationId), eq(c.id, counterId)))
  if (!row || !row.active) {
    throw httpError(400, 'Check the form: pair the rig with one of your active counters.', { fieldErrors: { counterId: 'Choose one of your active counters.' } })
  }
}

/** What a route sends for a counter: the fields a page shows, never the whole row. */
export function counterView(row: CounterRow) {
  return {
    id: row.id,
    serialNumber: row.serialNumber,
    description: row.description,
    sampleFlowCm3PerMin: row.sampleFlowCm3PerMin,
    calibrationDueOn: row.calibrationDueOn,
    siteId: row.siteId,
    active: row.active
  }
}

/** What a route sends for a bench rig: the fields a page shows, never the whole row. */
export function benchRigView(row: BenchRigRow) {
  return { id: row.id, serialNumber: row.serialNumber, description: row.description, counterId: row.counterId, siteId: row.siteId, active: row.active }
}
