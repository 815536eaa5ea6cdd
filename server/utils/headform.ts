import { and, desc, eq } from 'drizzle-orm'
import { computeHeadformTest, resolveHeadformPassLevel } from '#shared/utils/compute'
import type { HeadformTestForm } from '#shared/utils/mask-schemas'
import { subChecksFor } from '#shared/utils/mask-schemas'

type MaskType = typeof schema.maskTypes.$inferSelect
type HeadformRow = typeof schema.headformTests.$inferSelect

/** The mask type's pass level, or the computation module's labelled default. */
export function headformPassLevel(type: MaskType) {
  return resolveHeadformPassLevel(type.headformPassLevel ? { [type.id]: type.headformPassLevel } : null, type.id)
}

/** Recomputes a test from its stored raw inputs; nothing computed is ever stored. */
export function computeStoredHeadform(row: Pick<HeadformRow, 'outside' | 'inside' | 'sampleSeconds' | 'sampleFlowCm3PerMin' | 'passLevel' | 'subChecks'>, type: Pick<MaskType, 'hasDrinkTube' | 'hasExhalationValve'>) {
  return computeHeadformTest({
    bench: { outside: row.outside, inside: row.inside, sampleSeconds: row.sampleSeconds, sampleFlowCm3PerMin: row.sampleFlowCm3PerMin },
    passLevel: row.passLevel,
    subChecks: subChecksFor(type).map(c => ({ key: c.key, label: c.label, rule: c.rule, value: row.subChecks[c.key] }))
  })
}

export async function listHeadformTests(organizationId: string, filter: { maskUnitId?: string, limit?: number }) {
  const h = schema.headformTests
  // The test's own fields (never the organization), the mask type's parts that decide its sub-checks, and the names it shows.
  const rows = await useDb().select({
    id: h.id,
    maskUnitId: h.maskUnitId,
    benchRigId: h.benchRigId,
    counterId: h.counterId,
    siteId: h.siteId,
    performedAt: h.performedAt,
    performedBy: h.performedBy,
    outside: h.outside,
    inside: h.inside,
    sampleSeconds: h.sampleSeconds,
    sampleFlowCm3PerMin: h.sampleFlowCm3PerMin,
    passLevel: h.passLevel,
    passLevelIsDefault: h.passLevelIsDefault,
    subChecks: h.subChecks,
    passed: h.passed,
    notes: h.notes,
    hasDrinkTube: schema.maskTypes.hasDrinkTube,
    hasExhalationValve: schema.maskTypes.hasExhalationValve,
    serialNumber: schema.maskUnits.serialNumber,
    benchRigSerial: schema.benchRigs.serialNumber,
    performedByName: schema.users.displayName
  }).from(h)
    .innerJoin(schema.maskUnits, eq(schema.maskUnits.id, h.maskUnitId))
    .innerJoin(schema.maskTypes, eq(schema.maskTypes.id, schema.maskUnits.maskTypeId))
    .innerJoin(schema.benchRigs, eq(schema.benchRigs.id, h.benchRigId))
    .leftJoin(schema.users, eq(schema.users.id, h.performedBy))
    .where(and(eq(h.organizationId, organizationId), filter.maskUnitId ? eq(h.maskUnitId, filter.maskUnitId) : undefined))
    .orderBy(desc(h.performedAt))
    .limit(filter.limit ?? 200)
  return Promise.all(rows.map(async row => ({
    ...row,
    result: computeStoredHeadform(row, row),
    coverage: await findCoverage(organizationId, row)
  })))
}

/** Everything a new headform test needs, checked: the unit, the rig, its counter and the pass level. */
export async function planHeadformTest(organizationId: string, input: HeadformTestForm & { subChecks: Record<string, boolean> }) {
  const unit = await findMaskUnit(organizationId, input.maskUnitId)
  if (unit.state === 'retired') throw httpError(409, 'This unit is retired; retired units are not tested.')
  const rig = await findBenchRig(organizationId, input.benchRigId)
  if (!rig.active) throw httpError(409, 'This bench rig is retired; choose an active rig.')
  const counter = await findCounter(organizationId, rig.counterId)
  const type = await findMaskType(organizationId, unit.maskTypeId)
  const missing = subChecksFor(type).filter(c => typeof input.subChecks[c.key] !== 'boolean')
  if (missing.length) {
    const fieldErrors = Object.fromEntries(missing.map(c => [`subChecks.${c.key}`, `Mark "${c.label}" pass or fail.`]))
    throw httpError(400, `Check the form: mark "${missing[0]!.label}" pass or fail.`, { fieldErrors })
  }
  const applicable = Object.fromEntries(subChecksFor(type).map(c => [c.key, input.subChecks[c.key]!]))
  const level = headformPassLevel(type)
  const raw = { outside: input.outside, inside: input.inside, sampleSeconds: input.sampleSeconds, sampleFlowCm3PerMin: counter.sampleFlowCm3PerMin, passLevel: level.level, subChecks: applicable }
  const result = computeStoredHeadform(raw, type)
  if (!result.ok) {
    const fieldErrors = Object.fromEntries(result.issues.filter(i => i.severity === 'error').map(i => [i.field ?? '_', i.message]))
    throw httpError(400, `Check the form: ${result.issues[0]?.message}`, { fieldErrors })
  }
  return { unit, rig, counter, type, level, raw, result, siteId: rig.siteId ?? unit.siteId ?? counter.siteId }
}
