import type { Db } from '@/db/connect';

export type AuditEntry = {
  spaceId: string | null;
  actorId: string | null;
  action: string;
  targetType?: string;
  targetId?: string;
  detail?: Record<string, unknown>;
};

/** The audit_log row of an entry, for a service that writes it in one statement with its change. */
export function auditRow(e: AuditEntry) {
  return {
    space_id: e.spaceId,
    actor_id: e.actorId,
    action: e.action,
    target_type: e.targetType ?? null,
    target_id: e.targetId ?? null,
    detail: JSON.stringify(e.detail ?? {}),
  };
}

/** Written inside the caller's transaction so the audit row and the change commit together. */
export async function audit(db: Db, e: AuditEntry): Promise<void> {
  // across spaces: the line is written for the entry's own space (null for an account-wide line).
  await db.insertInto('audit_log').values(auditRow(e)).execute();
}
