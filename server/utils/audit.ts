import type { Caller } from './auth'

export interface AuditEntry {
  entityType: string
  entityId: string
  action: string
  before?: unknown
  after?: unknown
}

/** Appends to the audit trail inside the caller's transaction, so the change and its record land together. */
export async function writeAudit(tx: Tx | Database, caller: Pick<Caller, 'id' | 'organizationId'>, entry: AuditEntry) {
  await tx.insert(schema.auditEvents).values({
    organizationId: caller.organizationId,
    actorUserId: caller.id,
    entityType: entry.entityType,
    entityId: entry.entityId,
    action: entry.action,
    before: entry.before ?? null,
    after: entry.after ?? null
  })
}
