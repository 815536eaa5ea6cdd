import { and, asc, desc, eq, getTableColumns, sql } from 'drizzle-orm'
import type { z } from 'zod'
import type { listMaskUnitsQuerySchema, MaskUnitState } from '#shared/utils/mask-schemas'

export async function listMaskTypes(organizationId: string) {
  const t = schema.maskTypes
  return useDb().select().from(t).where(eq(t.organizationId, organizationId)).orderBy(asc(t.name))
}

export async function findMaskType(organizationId: string, id: string) {
  const t = schema.maskTypes
  const [row] = await useDb().select().from(t).where(and(eq(t.organizationId, organizationId), eq(t.id, id)))
  if (!row) throw httpError(404, 'No such mask type in your organization.')
  return row
}

const DAY_MS = 86_400_000

const unitColumns = {
  ...getTableColumns(schema.maskUnits),
  make: schema.respiratorModels.make,
  model: schema.respiratorModels.model,
  maskTypeName: schema.maskTypes.name,
  headformRetestDays: schema.maskTypes.headformRetestDays,
  siteName: schema.sites.name,
  lastHeadformAt: sql<string | null>`(select max(${schema.headformTests.performedAt}) from ${schema.headformTests} where ${schema.headformTests.maskUnitId} = ${schema.maskUnits.id})`
}

/** When the next headform test falls due: the last test plus the mask type's interval; now if never tested. */
export function headformDueOn(lastHeadformAt: string | Date | null, retestDays: number): string {
  const from = lastHeadformAt ? new Date(lastHeadformAt).getTime() + retestDays * DAY_MS : Date.now()
  return new Date(from).toISOString().slice(0, 10)
}

function unitQuery() {
  const u = schema.maskUnits
  return useDb().select(unitColumns).from(u)
    .innerJoin(schema.respiratorModels, eq(schema.respiratorModels.id, u.respiratorModelId))
    .innerJoin(schema.maskTypes, eq(schema.maskTypes.id, u.maskTypeId))
    .leftJoin(schema.sites, eq(schema.sites.id, u.siteId))
}

type UnitRow = Awaited<ReturnType<typeof unitQuery>>[number]
// A held unit needs a passing headform test before it returns to service: due now.
const withDue = (row: UnitRow) => ({
  ...row,
  headformDueOn: row.state === 'retired' ? null : row.state === 'held' ? headformDueOn(null, 0) : headformDueOn(row.lastHeadformAt, row.headformRetestDays)
})

export async function listMaskUnits(organizationId: string, query: z.output<typeof listMaskUnitsQuerySchema>) {
  const u = schema.maskUnits
  const rows = await unitQuery()
    .where(and(eq(u.organizationId, organizationId), query.state ? eq(u.state, query.state) : undefined, query.maskTypeId ? eq(u.maskTypeId, query.maskTypeId) : undefined))
    .orderBy(asc(u.serialNumber))
  return rows.map(withDue)
}

export async function findMaskUnit(organizationId: string, id: string) {
  const u = schema.maskUnits
  const [row] = await unitQuery().where(and(eq(u.organizationId, organizationId), eq(u.id, id)))
  if (!row) throw httpError(404, 'No such mask unit in your organization.')
  return withDue(row)
}

export async function listUnitEvents(organizationId: string, maskUnitId: string) {
  const e = schema.maskUnitEvents
  return useDb().select({ ...getTableColumns(e), actorName: schema.users.displayName }).from(e)
    .leftJoin(schema.users, eq(schema.users.id, e.actorUserId))
    .where(and(eq(e.organizationId, organizationId), eq(e.maskUnitId, maskUnitId)))
    .orderBy(desc(e.at))
}

/** Catalogue row and mask type sent by a form must both belong to the organization. */
export async function assertUnitRefs(organizationId: string, input: { respiratorModelId?: string, maskTypeId?: string, siteId?: string | null }) {
  const fieldError = (field: string, message: string) => httpError(400, `Check the form: ${message}`, { fieldErrors: { [field]: message } })
  if (input.respiratorModelId) {
    await findRespiratorModel(organizationId, input.respiratorModelId).catch(() => {
      throw fieldError('respiratorModelId', 'Choose a model from your catalogue.')
    })
  }
  if (input.maskTypeId) {
    await findMaskType(organizationId, input.maskTypeId).catch(() => {
      throw fieldError('maskTypeId', 'Choose one of your mask types.')
    })
  }
  await assertSite(organizationId, input.siteId)
}

type Tx = Parameters<Parameters<Database['transaction']>[0]>[0]

/** Moves a unit to a new state and keeps the change, with its reason, in the unit's history. */
export async function changeUnitState(tx: Tx, caller: Caller, unit: { id: string, state: MaskUnitState }, to: MaskUnitState, reason: string, headformTestId: string | null = null) {
  await tx.update(schema.maskUnits).set({ state: to }).where(and(eq(schema.maskUnits.organizationId, caller.organizationId), eq(schema.maskUnits.id, unit.id)))
  await tx.insert(schema.maskUnitEvents).values({ organizationId: caller.organizationId, maskUnitId: unit.id, fromState: unit.state, toState: to, reason, headformTestId, actorUserId: caller.id })
  await writeAudit(tx, caller, { entityType: 'mask-unit', entityId: unit.id, action: `state-${to}`, before: { state: unit.state }, after: { state: to, reason } })
}
