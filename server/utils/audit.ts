import type { Transaction } from 'sequelize'
import { AuditEntry } from '../models/accounts'

export interface AuditInput {
  actorUserId: number | null
  organisationId?: number | null
  action: string
  entity: string
  entityId?: string | number | null
  changes?: Record<string, unknown>
}

/** Writes one audit entry (who, when, what changed) inside the caller's write transaction. */
export async function audit(t: Transaction, e: AuditInput): Promise<void> {
  await AuditEntry.create({
    actorUserId: e.actorUserId,
    organisationId: e.organisationId ?? null,
    action: e.action,
    entity: e.entity,
    entityId: e.entityId == null ? null : String(e.entityId),
    changes: JSON.stringify(e.changes ?? {}),
  }, { transaction: t })
}
