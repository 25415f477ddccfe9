// People of a network: list members and invitations not yet accepted, change a member's role,
// remove a person, revoke an invitation. Coordinators move people between grower and member;
// only an admin grants or removes coordinator and admin, and the network always keeps an admin.
import { In, IsNull, MoreThan, type DataSource, type EntityManager } from 'typeorm';
import type { Role } from '../../shared/schemas/common';
import {
  grantableRoles,
  type NetworkMember,
  type NetworkPeople,
} from '../../shared/schemas/people';
import { Invitation } from '../../db/entities/invitation.entity';
import { Membership } from '../../db/entities/membership.entity';
import { Site } from '../../db/entities/site.entity';
import { Trial } from '../../db/entities/trial.entity';
import { User } from '../../db/entities/user.entity';
import { recordAudit } from '../audit/audit.service';
import { Conflict, Forbidden, NotFound } from '../errors';

interface MemberRow {
  user_id: string;
  name: string;
  email: string;
  role: Role;
  site_count: number;
}

function presentMember(row: MemberRow): NetworkMember {
  return {
    userId: row.user_id,
    name: row.name,
    email: row.email,
    role: row.role,
    siteCount: Number(row.site_count),
  };
}

export function createPeopleService(dataSource: DataSource) {
  function members(db: EntityManager, networkId: string) {
    return db
      .getRepository(Membership)
      .createQueryBuilder('m')
      .innerJoin(User, 'u', 'u.id = m.user_id')
      .select('u.id', 'user_id')
      .addSelect('u.name', 'name')
      .addSelect('u.email', 'email')
      .addSelect('m.role', 'role')
      .addSelect(
        (sub) =>
          sub
            .select('count(*)::int')
            .from(Site, 's')
            .innerJoin(Trial, 't', 't.id = s.trial_id')
            .where('t.network_id = m.network_id AND s.grower_user_id = u.id'),
        'site_count',
      )
      .where('m.network_id = :networkId', { networkId });
  }

  async function list(networkId: string): Promise<NetworkPeople> {
    const db = dataSource.manager;
    const [rows, invitations] = await Promise.all([
      members(db, networkId).orderBy('lower(u.name)').addOrderBy('u.email').getRawMany<MemberRow>(),
      db.getRepository(Invitation).find({
        where: { networkId, acceptedAt: IsNull(), expiresAt: MoreThan(new Date()) },
        order: { createdAt: 'DESC' },
      }),
    ]);
    return {
      members: rows.map(presentMember),
      invitations: invitations.map((i) => ({
        id: i.id,
        email: i.email,
        role: i.role,
        expiresAt: new Date(i.expiresAt).toISOString(),
        createdAt: new Date(i.createdAt).toISOString(),
      })),
    };
  }

  /** The network's memberships, locked so two admins changing each other cannot both succeed. */
  function lockMemberships(manager: EntityManager, networkId: string) {
    return manager
      .getRepository(Membership)
      .createQueryBuilder('m')
      .setLock('pessimistic_write')
      .where('m.network_id = :networkId', { networkId })
      .orderBy('m.id')
      .getMany();
  }

  async function changeRole(input: {
    networkId: string;
    userId: string;
    role: Role;
    actorUserId: string;
    actorRole: Role;
  }): Promise<NetworkMember> {
    return dataSource.transaction(async (manager) => {
      const rows = await lockMemberships(manager, input.networkId);
      const target = rows.find((r) => r.userId === input.userId);
      if (!target) throw new NotFound('Person');
      const allowed = grantableRoles(input.actorRole);
      if (!allowed.includes(target.role) || !allowed.includes(input.role)) {
        throw new Forbidden('Only an admin can grant or remove the coordinator and admin roles');
      }
      if (target.role !== input.role) {
        if (target.role === 'admin' && rows.filter((r) => r.role === 'admin').length === 1) {
          throw new Conflict('This is the network’s last admin; make someone else an admin first', {
            role: target.role,
          });
        }
        await manager.getRepository(Membership).update({ id: target.id }, { role: input.role });
        await recordAudit(manager, {
          actorUserId: input.actorUserId,
          entityType: 'membership',
          entityId: target.id,
          action: 'role_changed',
          before: { userId: input.userId, networkId: input.networkId, role: target.role },
          after: { userId: input.userId, networkId: input.networkId, role: input.role },
        });
      }
      const updated = await members(manager, input.networkId)
        .andWhere('m.user_id = :userId', { userId: input.userId })
        .getRawOne<MemberRow>();
      return presentMember(updated!);
    });
  }

  /**
   * Takes a person out of the network. Access is checked against memberships on every request,
   * so their sessions lose this network at once; the sites they grew are left without a grower
   * until a coordinator hands them on.
   */
  async function remove(input: {
    networkId: string;
    userId: string;
    actorUserId: string;
    actorRole: Role;
  }): Promise<{ sitesLeftWithoutGrower: number }> {
    return dataSource.transaction(async (manager) => {
      const rows = await lockMemberships(manager, input.networkId);
      const target = rows.find((r) => r.userId === input.userId);
      if (!target) throw new NotFound('Person');
      if (!grantableRoles(input.actorRole).includes(target.role)) {
        throw new Forbidden('Only an admin can remove a coordinator or an admin');
      }
      if (target.role === 'admin' && rows.filter((r) => r.role === 'admin').length === 1) {
        throw new Conflict('This is the network’s last admin; make someone else an admin first', {
          role: target.role,
        });
      }
      const trialIds = (
        await manager.getRepository(Trial).find({
          select: { id: true },
          where: { networkId: input.networkId },
        })
      ).map((t) => t.id);
      const sites = trialIds.length
        ? await manager.getRepository(Site).find({
            select: { id: true, fieldName: true, trialId: true },
            where: { trialId: In(trialIds), growerUserId: input.userId },
          })
        : [];
      if (sites.length > 0) {
        await manager
          .getRepository(Site)
          .update({ id: In(sites.map((s) => s.id)) }, { growerUserId: null, growerEmail: null });
      }
      await manager.getRepository(Membership).delete({ id: target.id });
      await recordAudit(manager, {
        actorUserId: input.actorUserId,
        entityType: 'membership',
        entityId: target.id,
        action: 'removed',
        before: { userId: input.userId, networkId: input.networkId, role: target.role },
        after: { sitesLeftWithoutGrower: sites.map((s) => s.id) },
      });
      for (const site of sites) {
        await recordAudit(manager, {
          actorUserId: input.actorUserId,
          entityType: 'site',
          entityId: site.id,
          siteId: site.id,
          action: 'grower_removed',
          before: { growerUserId: input.userId },
          after: { growerUserId: null },
        });
      }
      return { sitesLeftWithoutGrower: sites.length };
    });
  }

  async function revokeInvitation(input: {
    networkId: string;
    invitationId: string;
    actorUserId: string;
  }): Promise<void> {
    await dataSource.transaction(async (manager) => {
      const repo = manager.getRepository(Invitation);
      const row = await repo
        .createQueryBuilder('i')
        .setLock('pessimistic_write')
        .where('i.id = :id AND i.network_id = :networkId', {
          id: input.invitationId,
          networkId: input.networkId,
        })
        .andWhere('i.accepted_at IS NULL AND i.expires_at > now()')
        .getOne();
      if (!row) throw new NotFound('Invitation');
      await repo.update({ id: row.id }, { expiresAt: () => 'now()' });
      await recordAudit(manager, {
        actorUserId: input.actorUserId,
        entityType: 'invitation',
        entityId: row.id,
        action: 'revoked',
        before: { email: row.email, role: row.role, networkId: input.networkId },
      });
    });
  }

  return { list, changeRole, remove, revokeInvitation };
}
