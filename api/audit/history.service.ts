// A site's history for its grower and coordinators, as plain sentences (see plain-words.ts).
import { In, type DataSource } from 'typeorm';
import type { HistoryEntry } from '../../shared/schemas/history';
import { AuditEvent } from '../../db/entities/audit-event.entity';
import { Site } from '../../db/entities/site.entity';
import { Strip } from '../../db/entities/strip.entity';
import { Trial } from '../../db/entities/trial.entity';
import { User } from '../../db/entities/user.entity';
import { NotFound } from '../errors';
import { describeEvent } from './plain-words';

export function createHistoryService(dataSource: DataSource) {
  async function forSite(siteId: string): Promise<HistoryEntry[]> {
    const db = dataSource.manager;
    const site = await db.getRepository(Site).findOneBy({ id: siteId });
    if (!site) throw new NotFound('Site');
    const trial = await db.getRepository(Trial).findOneByOrFail({ id: site.trialId });
    const events = await db.getRepository(AuditEvent).find({
      where: { siteId },
      order: { createdAt: 'DESC', id: 'ASC' },
      take: 500,
    });
    const stripIds = new Set<string>();
    const userIds = new Set<string>();
    for (const e of events) {
      if (e.entityType === 'strip') stripIds.add(e.entityId);
      const photoStrip = e.after?.stripId;
      if (typeof photoStrip === 'string') stripIds.add(photoStrip);
      if (e.actorUserId) userIds.add(e.actorUserId);
      for (const id of [e.after?.growerUserId, e.before?.growerUserId])
        if (typeof id === 'string') userIds.add(id);
    }
    const [strips, users] = await Promise.all([
      stripIds.size ? db.getRepository(Strip).findBy({ id: In([...stripIds]) }) : [],
      userIds.size ? db.getRepository(User).findBy({ id: In([...userIds]) }) : [],
    ]);
    const stripById = new Map(strips.map((s) => [s.id, s]));
    const names = new Map(users.map((u) => [u.id, u.name]));
    return events.map((e) => {
      const stripId =
        e.entityType === 'strip'
          ? e.entityId
          : typeof e.after?.stripId === 'string'
            ? e.after.stripId
            : null;
      const strip = stripId ? stripById.get(stripId) : undefined;
      const who = e.actorUserId ? (names.get(e.actorUserId) ?? 'A former member') : 'Sheaf';
      return {
        id: e.id,
        at: new Date(e.createdAt).toISOString(),
        who,
        sentence: describeEvent(
          {
            action: e.action,
            entityType: e.entityType,
            who,
            before: e.before,
            after: e.after,
            strip: strip ? { block: strip.block, position: strip.position } : null,
          },
          { unitSystem: trial.unitSystem, names },
        ),
      };
    });
  }

  return { forSite };
}
