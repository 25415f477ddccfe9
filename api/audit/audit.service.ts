// Records who changed what (old and new values) inside the caller's transaction.
import type { EntityManager } from 'typeorm';

export interface AuditInput {
  actorUserId: string | null;
  entityType: string;
  entityId: string;
  siteId?: string | null;
  action: string;
  before?: Record<string, unknown> | null;
  after?: Record<string, unknown> | null;
}

export async function recordAudit(manager: EntityManager, event: AuditInput): Promise<void> {
  await manager.query(
    `INSERT INTO audit_events (actor_user_id, entity_type, entity_id, site_id, action, before, after)
     VALUES ($1, $2, $3, $4, $5, $6, $7)`,
    [
      event.actorUserId,
      event.entityType,
      event.entityId,
      event.siteId ?? null,
      event.action,
      event.before ? JSON.stringify(event.before) : null,
      event.after ? JSON.stringify(event.after) : null,
    ],
  );
}
