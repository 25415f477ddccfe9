// Changes to a site outside its design: hand it to another grower (coordinator), mark it lost
// with a reason (coordinator), and the grower's choice to be named in network reports.
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/schemas/common';
import type { SiteChangeInput, SiteChangeResult } from '../../shared/schemas/site-change';
import { Membership } from '../../db/entities/membership.entity';
import { Site } from '../../db/entities/site.entity';
import { Trial } from '../../db/entities/trial.entity';
import { User } from '../../db/entities/user.entity';
import { recordAudit } from '../audit/audit.service';
import { Forbidden, Locked, NotFound, ValidationError } from '../errors';
import { isCoordinating } from '../middleware/access';

export function createSiteChangesService(dataSource: DataSource) {
  async function change(input: {
    siteId: string;
    actorUserId: string;
    roles: ReadonlyMap<string, Role>;
    change: SiteChangeInput;
  }): Promise<SiteChangeResult> {
    const { change } = input;
    return dataSource.transaction(async (manager) => {
      const site = await manager
        .getRepository(Site)
        .createQueryBuilder('s')
        .setLock('pessimistic_write')
        .where('s.id = :id', { id: input.siteId })
        .getOne();
      if (!site) throw new NotFound('Site');
      const trial = await manager.getRepository(Trial).findOneByOrFail({ id: site.trialId });
      const coordinating = isCoordinating(input.roles.get(trial.networkId));
      const isGrower = site.growerUserId !== null && site.growerUserId === input.actorUserId;
      if ((change.growerUserId !== undefined || change.lostReason !== undefined) && !coordinating)
        throw new Forbidden('Only a coordinator can hand a site over or mark it lost');
      if (change.namedInReports !== undefined && !isGrower)
        throw new Forbidden('Only the site’s grower chooses how the farm is named in reports');
      if (
        trial.status === 'closed' &&
        (change.growerUserId !== undefined || change.lostReason !== undefined)
      )
        throw new Locked('This trial is closed and read-only: reopen it to change its sites');

      if (change.growerUserId !== undefined && change.growerUserId !== site.growerUserId) {
        if (change.growerUserId !== null) {
          const membership = await manager
            .getRepository(Membership)
            .findOneBy({ userId: change.growerUserId, networkId: trial.networkId });
          if (!membership)
            throw new ValidationError('That person is not in this network', {
              growerUserId: 'not a member of this network',
            });
          if (membership.role === 'member')
            throw new ValidationError('Make this person a grower first', {
              growerUserId: 'is a member, not a grower, of this network',
            });
        }
        const before = { growerUserId: site.growerUserId, growerEmail: site.growerEmail };
        site.growerUserId = change.growerUserId;
        site.growerEmail = null;
        // A new grower makes their own choice about being named.
        site.namedInReports = false;
        await recordAudit(manager, {
          actorUserId: input.actorUserId,
          entityType: 'site',
          entityId: site.id,
          siteId: site.id,
          action: 'handed_over',
          before,
          after: { growerUserId: change.growerUserId },
        });
      }
      if (change.lostReason !== undefined && change.lostReason !== site.lostReason) {
        await recordAudit(manager, {
          actorUserId: input.actorUserId,
          entityType: 'site',
          entityId: site.id,
          siteId: site.id,
          action: change.lostReason === null ? 'lost_withdrawn' : 'marked_lost',
          before: { lostReason: site.lostReason },
          after: { lostReason: change.lostReason },
        });
        site.lostReason = change.lostReason;
      }
      if (change.namedInReports !== undefined && change.namedInReports !== site.namedInReports) {
        await recordAudit(manager, {
          actorUserId: input.actorUserId,
          entityType: 'site',
          entityId: site.id,
          siteId: site.id,
          action: 'naming_changed',
          before: { namedInReports: site.namedInReports },
          after: { namedInReports: change.namedInReports },
        });
        site.namedInReports = change.namedInReports;
      }
      await manager.getRepository(Site).update(
        { id: site.id },
        {
          growerUserId: site.growerUserId,
          growerEmail: site.growerEmail,
          lostReason: site.lostReason,
          namedInReports: site.namedInReports,
        },
      );
      const grower = site.growerUserId
        ? await manager.getRepository(User).findOneBy({ id: site.growerUserId })
        : null;
      return {
        id: site.id,
        growerUserId: site.growerUserId,
        growerName: grower?.name ?? null,
        lostReason: site.lostReason,
        namedInReports: site.namedInReports,
      };
    });
  }

  return { change };
}
