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

/** The column list every audit write uses (also inside the single-statement strip change). */
export const AUDIT_INSERT = `INSERT INTO audit_events (actor_user_id, entity_type, entity_id, site_id, action, before, after)`;

export async function recordAudit(manager: EntityManager, event: AuditInput): Promise<void> {
  await manager.query(`${AUDIT_INSERT} VALUES ($1, $2, $3, $4, $5, $6, $7)`, [
    event.actorUserId,
    event.entityType,
    event.entityId,
    event.siteId ?? null,
    event.action,
    event.before ? JSON.stringify(event.before) : null,
    event.after ? JSON.stringify(event.after) : null,
  ]);
}

/** Records many audit events in one statement per thousand (a CSV import touches every strip). */
export async function recordAuditsInBulk(
  manager: EntityManager,
  events: readonly AuditInput[],
): Promise<void> {
  for (let start = 0; start < events.length; start += 1000) {
    const chunk = events.slice(start, start + 1000).map((e) => ({
      actor_user_id: e.actorUserId,
      entity_type: e.entityType,
      entity_id: e.entityId,
      site_id: e.siteId ?? null,
      action: e.action,
      before: e.before ?? null,
      after: e.after ?? null,
    }));
    await manager.query(
      `${AUDIT_INSERT}
       SELECT x.actor_user_id, x.entity_type, x.entity_id, x.site_id, x.action, x.before, x.after
         FROM jsonb_to_recordset($1::jsonb)
           AS x(actor_user_id uuid, entity_type text, entity_id uuid, site_id uuid, action text, before jsonb, after jsonb)`,
      [JSON.stringify(chunk)],
    );
  }
}
