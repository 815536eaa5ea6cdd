import { and, asc, desc, eq, gt, sql } from 'drizzle-orm'
import type { z } from 'zod'
import { MASK_UNIT_STATE_LABELS } from '#shared/utils/mask-schemas'
import type { listMaskUnitsQuerySchema, MaskUnitState } from '#shared/utils/mask-schemas'

export async function listMaskTypes(organizationId: string) {
  const t = schema.maskTypes
  const rows = await useDb().select().from(t).where(eq(t.organizationId, organizationId)).orderBy(asc(t.name))
  return rows.map(maskTypeView)
}

/** What a route sends for a mask type: the fields the pages show, never the whole row. */
export function maskTypeView(row: MaskTypeRow) {
  return { id: row.id, name: row.name, hasDrinkTube: row.hasDrinkTube, hasExhalationValve: row.hasExhalationValve, headformPassLevel: row.headformPassLevel, headformRetestDays: row.headformRetestDays }
}

export async function findMaskType(organizationId: string, id: string) {
  const t = schema.maskTypes
  const [row] = await useDb().select().from(t).where(and(eq(t.organizationId, organizationId), eq(t.id, id)))
  if (!row) throw httpError(404, 'No such mask type in your organization.')
  return row
}

const DAY_MS = 86_400_000

const u = schema.maskUnits
/** What a route sends for a mask unit: its own fields (never the organization) and what it shows beside them. */
const unitColumns = {
  id: u.id,
  serialNumber: u.serialNumber,
  respiratorModelId: u.respiratorModelId,
  maskTypeId: u.maskTypeId,
  size: u.size,
  siteId: u.siteId,
  state: u.state,
  make: schema.respiratorModels.make,
  model: schema.respiratorModels.model,
  maskTypeName: schema.maskTypes.name,
  headformRetestDays: schema.maskTypes.headformRetestDays,
  siteName: schema.sites.name,
  // The retest interval runs from the last passing test: a failed test leaves the unit due.
  lastHeadformAt: sql<string | null>`(select max(${schema.headformTests.performedAt}) from ${schema.headformTests} where ${schema.headformTests.maskUnitId} = ${schema.maskUnits.id} and ${schema.headformTests.passed} = true)`
}

/** When the next headform test falls due: the last passing test plus the mask type's interval; now if never passed. */
export function headformDueOn(lastHeadformAt: string | Date | null, retestDays: number): string {
  const from = lastHeadformAt ? new Date(lastHeadformAt).getTime() + retestDays * DAY_MS : Date.now()
  return new Date(from).toISOString().slice(0, 10)
}

function unitQuery() {
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
  const rows = await unitQuery()
    .where(and(eq(u.organizationId, organizationId), query.state ? eq(u.state, query.state) : undefined, query.maskTypeId ? eq(u.maskTypeId, query.maskTypeId) : undefined))
    .orderBy(asc(u.serialNumber))
  return rows.map(withDue)
}

export async function findMaskUnit(organizationId: string, id: string) {
  const [row] = await unitQuery().where(and(eq(u.organizationId, organizationId), eq(u.id, id)))
  if (!row) throw httpError(404, 'No such mask unit in your organization.')
  return withDue(row)
}

export async function listUnitEvents(organizationId: string, maskUnitId: string) {
  const e = schema.maskUnitEvents
  return useDb().select({
    id: e.id, fromState: e.fromState, toState: e.toState, reason: e.reason, headformTestId: e.headformTestId,
    override: e.override, at: e.at, actorName: schema.users.displayName
  }).from(e)
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

/** Moves a unit to a new state and keeps the change, with its reason, in the unit's history. */
export async function changeUnitState(tx: Tx, caller: Caller, unit: { id: string, state: MaskUnitState }, to: MaskUnitState, reason: string, headformTestId: string | null = null, override = false) {
  await tx.update(schema.maskUnits).set({ state: to }).where(and(eq(schema.maskUnits.organizationId, caller.organizationId), eq(schema.maskUnits.id, unit.id)))
  await tx.insert(schema.maskUnitEvents).values({ organizationId: caller.organizationId, maskUnitId: unit.id, fromState: unit.state, toState: to, reason, headformTestId, override, actorUserId: caller.id })
  await writeAudit(tx, caller, { entityType: 'mask-unit', entityId: unit.id, action: override ? `state-${to}-override` : `state-${to}`, before: { state: unit.state }, after: { state: to, reason, override, headformTestId } })
}

/** The first passing headform test of a unit recorded after an instant, if any. */
async function passingTestAfter(tx: Tx, organizationId: string, maskUnitId: string, after: Date) {
  const h = schema.headformTests
  const [row] = await tx.select({ id: h.id, performedAt: h.performedAt }).from(h)
    .where(and(eq(h.organizationId, organizationId), eq(h.maskUnitId, maskUnitId), eq(h.passed, true), gt(h.performedAt, after)))
    .orderBy(desc(h.performedAt)).limit(1)
  return row ?? null
}

/**
 * Changes a unit's state under a row lock, so a "retire" and an "in service" sent at the same moment
 * are applied one after the other and a retired unit stays retired. A held unit returns to service
 * only after a passing headform test recorded after the hold, or when a program admin overrides
 * with a reason (kept in the history and the audit trail).
 */
export async function moveUnitState(caller: Caller, unitId: string, to: MaskUnitState, reason: string, options: { override?: boolean } = {}) {
  const u = schema.maskUnits
  await useDb().transaction(async (tx) => {
    const [unit] = await tx.select({ id: u.id, state: u.state }).from(u)
      .where(and(eq(u.organizationId, caller.organizationId), eq(u.id, unitId))).for('update')
    if (!unit) throw httpError(404, 'No such mask unit in your organization.')
    if (unit.state === 'retired') throw httpError(409, 'This unit is retired; a retired unit does not come back into use.')
    if (unit.state === to) throw httpError(409, `This unit is already ${MASK_UNIT_STATE_LABELS[to].toLowerCase()}.`)
    let headformTestId: string | null = null
    let override = false
    if (unit.state === 'held' && to === 'in-service') {
      const e = schema.maskUnitEvents
      const [hold] = await tx.select({ at: e.at }).from(e)
        .where(and(eq(e.organizationId, caller.organizationId), eq(e.maskUnitId, unit.id), eq(e.toState, 'held'))).orderBy(desc(e.at)).limit(1)
      // Without a recorded hold, only a test from now on counts.
      const pass = await passingTestAfter(tx, caller.organizationId, unit.id, hold?.at ?? new Date())
      if (pass) {
        headformTestId = pass.id
      } else if (!options.override) {
        throw httpError(409, 'A held unit returns to service only after a passing headform test recorded after the hold. Test it on the bench first; a program admin may override with a reason.', { needsHeadformTest: true })
      } else if (caller.role !== 'admin') {
        throw httpError(403, 'Only a program admin may return a held unit to service without a passing headform test.')
      } else {
        override = true
      }
    }
    await changeUnitState(tx, caller, unit, to, reason, headformTestId, override)
  })
}

/**
 * Field message when the unit chosen for a fit test cannot be used, or null when it is fine. A
 * correction (revision 2 on) describes a test already done, so the unit's state today does not
 * matter there: only that it is the model and size tested.
 */
export async function maskUnitProblem(organizationId: string, input: { respiratorModelId: string, respiratorSize: string, maskUnitId: string | null, revision?: number }): Promise<string | null> {
  const u = schema.maskUnits
  if (!input.maskUnitId) {
    const [tracked] = await useDb().select({ id: u.id }).from(u).where(and(eq(u.organizationId, organizationId), eq(u.respiratorModelId, input.respiratorModelId))).limit(1)
    return tracked ? 'Units of this model are tracked by serial number: choose the unit the wearer wears.' : null
  }
  const [unit] = await useDb().select().from(u).where(and(eq(u.organizationId, organizationId), eq(u.id, input.maskUnitId)))
  if (!unit) return 'Choose one of your mask units.'
  if (unit.respiratorModelId !== input.respiratorModelId) return `Unit ${unit.serialNumber} is another model than the respirator chosen.`
  if (unit.size !== input.respiratorSize) return `Unit ${unit.serialNumber} is size ${unit.size}, not ${input.respiratorSize}.`
  if ((input.revision ?? 1) > 1) return null
  if (unit.state === 'held') return `Unit ${unit.serialNumber} is held: it needs a passing headform test before anyone wears it.`
  if (unit.state === 'retired') return `Unit ${unit.serialNumber} is retired.`
  return null
}

/** Refuses a fit-test form whose mask unit cannot be used, beside the field. */
export async function assertMaskUnitChoice(organizationId: string, input: { respiratorModelId: string, respiratorSize: string, maskUnitId: string | null, revision?: number }) {
  const problem = await maskUnitProblem(organizationId, input)
  if (problem) throw httpError(400, `Check the form: ${problem}`, { fieldErrors: { maskUnitId: problem } })
}

/** At finish: the unit may have been held or retired since the draft was started. */
export async function assertUsableMaskUnit(organizationId: string, row: { respiratorModelId: string, respiratorSize: string, maskUnitId: string | null, revision: number }) {
  const problem = await maskUnitProblem(organizationId, row)
  if (problem) throw httpError(409, `The test cannot be finished: ${problem}`, { fieldErrors: { maskUnitId: problem } })
}
