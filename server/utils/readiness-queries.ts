// Readiness checks and templates: the reads, always scoped to the caller's organization.
// The rules a check follows (planning, locking, one step at a time) are in readiness-guards.ts.
import { and, asc, desc, eq } from 'drizzle-orm'
import type { z } from 'zod'
import { DEFAULT_TEMPLATES } from '#shared/utils/readiness-defaults'
import type { listChecksQuerySchema } from '#shared/utils/readiness-schemas'

/** Every organization gets the default templates the first time its templates are read. */
export async function ensureDefaultTemplates(organizationId: string) {
  const t = schema.readinessTemplates
  const [any] = await useDb().select({ id: t.id }).from(t).where(eq(t.organizationId, organizationId)).limit(1)
  if (any) return
  await useDb().insert(t).values(DEFAULT_TEMPLATES.map(d => ({ ...d, organizationId, isDefault: true })))
}

export async function listTemplates(organizationId: string) {
  await ensureDefaultTemplates(organizationId)
  const t = schema.readinessTemplates
  const rows = await useDb().select().from(t).where(eq(t.organizationId, organizationId)).orderBy(desc(t.active), asc(t.scope), asc(t.name))
  return rows.map(readinessTemplateView)
}

/** What a route sends for a readiness template: the fields the pages show, never the whole row. */
export function readinessTemplateView(row: ReadinessTemplateRow) {
  return { id: row.id, name: row.name, scope: row.scope, steps: row.steps, isDefault: row.isDefault, active: row.active }
}

export async function findTemplate(organizationId: string, id: string) {
  const t = schema.readinessTemplates
  const [row] = await useDb().select().from(t).where(and(eq(t.organizationId, organizationId), eq(t.id, id)))
  if (!row) throw httpError(404, 'No such readiness template in your organization.')
  return row
}

const c = schema.readinessChecks
/** What a route sends for a readiness check: its own fields (never the organization) and the names it shows. */
const checkColumns = {
  id: c.id,
  templateId: c.templateId,
  templateName: c.templateName,
  counterId: c.counterId,
  benchRigId: c.benchRigId,
  siteId: c.siteId,
  maskTypeId: c.maskTypeId,
  steps: c.steps,
  skippedSteps: c.skippedSteps,
  entries: c.entries,
  currentStep: c.currentStep,
  status: c.status,
  abandonReason: c.abandonReason,
  startedAt: c.startedAt,
  completedAt: c.completedAt,
  performedBy: c.performedBy,
  counterSerial: schema.counters.serialNumber,
  benchRigSerial: schema.benchRigs.serialNumber,
  maskTypeName: schema.maskTypes.name,
  siteName: schema.sites.name,
  performedByName: schema.users.displayName
}

function checkQuery() {
  return useDb().select(checkColumns).from(c)
    .innerJoin(schema.counters, eq(schema.counters.id, c.counterId))
    .leftJoin(schema.benchRigs, eq(schema.benchRigs.id, c.benchRigId))
    .leftJoin(schema.maskTypes, eq(schema.maskTypes.id, c.maskTypeId))
    .leftJoin(schema.sites, eq(schema.sites.id, c.siteId))
    .leftJoin(schema.users, eq(schema.users.id, c.performedBy))
}

export async function listChecks(organizationId: string, query: z.output<typeof listChecksQuerySchema>) {
  return checkQuery()
    .where(and(
      eq(c.organizationId, organizationId),
      query.counterId ? eq(c.counterId, query.counterId) : undefined,
      query.benchRigId ? eq(c.benchRigId, query.benchRigId) : undefined,
      query.status ? eq(c.status, query.status) : undefined
    ))
    .orderBy(desc(c.startedAt))
    .limit(query.limit)
}

export async function findCheck(organizationId: string, id: string) {
  const [row] = await checkQuery().where(and(eq(c.organizationId, organizationId), eq(c.id, id)))
  if (!row) throw httpError(404, 'No such readiness check in your organization.')
  return row
}
