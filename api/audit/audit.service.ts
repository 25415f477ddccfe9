// Records who changed what (old and new values) inside the caller's transaction.
import type { EntityManager } from 'typeorm';
import type { QueryDeepPartialEntity } from 'typeorm/query-builder/QueryPartialEntity.js';
import { AuditEvent } from '../../db/entities/audit-event.entity';

export interface AuditInput {
  actorUserId: string | null;
  entityType: string;
  entityId: string;
  siteId?: string | null;
  action: string;
  before?: Record<string, unknown> | null;
  after?: Record<string, unknown> | null;
}

function auditRow(event: AuditInput): QueryDeepPartialEntity<AuditEvent> {
  return {
    actorUserId: event.actorUserId,
    entityType: event.entityType,
    entityId: event.entityId,
    siteId: event.siteId ?? null,
    action: event.action,
    // Free-form jsonb: TypeORM's deep-partial type cannot describe an open record.
    before: (event.before ?? null) as QueryDeepPartialEntity<AuditEvent>['before'],
    after: (event.after ?? null) as QueryDeepPartialEntity<AuditEvent>['after'],
  };
}

export async function recordAudit(manager: EntityManager, event: AuditInput): Promise<void> {
  await manager.getRepository(AuditEvent).insert(auditRow(event));
}

/** Records many audit events, a thousand per statement (a CSV import touches every strip). */
export async function recordAuditsInBulk(
  manager: EntityManager,
  events: readonly AuditInput[],
): Promise<void> {
  for (let start = 0; start < events.length; start += 1000) {
    await manager.getRepository(AuditEvent).insert(events.slice(start, start + 1000).map(auditRow));
  }
}
