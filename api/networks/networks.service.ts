// Networks: start one (its first person becomes admin), list a person's networks, and delete
// one with everything in it (trials, sites, data, photos, invitations, history).
import { endSessionsOf } from '../../db/repositories/user-sessions.repository';
import fs from 'node:fs/promises';
import path from 'node:path';
import { In, type DataSource } from 'typeorm';
import type { NetworkSummary } from '../../shared/schemas/network';
import { Attachment } from '../../db/entities/attachment.entity';
import { AuditEvent } from '../../db/entities/audit-event.entity';
import { Invitation } from '../../db/entities/invitation.entity';
import { Membership } from '../../db/entities/membership.entity';
import { Network } from '../../db/entities/network.entity';
import { Site } from '../../db/entities/site.entity';
import { Strip } from '../../db/entities/strip.entity';
import { Trial } from '../../db/entities/trial.entity';
import { User } from '../../db/entities/user.entity';
import { recordAudit } from '../audit/audit.service';
import { startNetwork } from '../lib/start-network';
import { Forbidden, NotFound, ValidationError } from '../errors';

export function createNetworksService(deps: { dataSource: DataSource; uploadDir: string }) {
  const { dataSource } = deps;

  async function mine(userId: string): Promise<NetworkSummary[]> {
    const rows = await dataSource
      .getRepository(Membership)
      .createQueryBuilder('m')
      .innerJoin(Network, 'n', 'n.id = m.network_id')
      .select('n.id', 'id')
      .addSelect('n.name', 'name')
      .addSelect('m.role', 'role')
      .where('m.user_id = :userId', { userId })
      .orderBy('n.name')
      .getRawMany<NetworkSummary>();
    return rows;
  }

  async function create(userId: string, name: string): Promise<NetworkSummary> {
    const id = await dataSource.transaction((manager) => startNetwork(manager, name, userId));
    return { id, name, role: 'admin' };
  }

  /**
   * Deletes the network and everything in it. People keep their accounts while they belong to
   * another network; accounts left with no network are deleted too (except the admin's own).
   */
  async function remove(input: {
    networkId: string;
    actorUserId: string;
    confirmName: string;
  }): Promise<{ deletedPhotos: number; deletedAccounts: number }> {
    const storedNames: string[] = [];
    const result = await dataSource.transaction(async (manager) => {
      const network = await manager
        .getRepository(Network)
        .createQueryBuilder('n')
        .setLock('pessimistic_write')
        .where('n.id = :id', { id: input.networkId })
        .getOne();
      if (!network) throw new NotFound('Network');
      const actor = await manager
        .getRepository(Membership)
        .findOneBy({ networkId: network.id, userId: input.actorUserId });
      if (actor?.role !== 'admin') throw new Forbidden('Only an admin can delete the network');
      if (input.confirmName.trim() !== network.name.trim()) {
        throw new ValidationError('Type the network’s name exactly to delete it', {
          confirmName: `does not match the network’s name`,
        });
      }
      const trialIds = (
        await manager.getRepository(Trial).find({
          select: { id: true },
          where: { networkId: network.id },
        })
      ).map((t) => t.id);
      const siteIds = trialIds.length
        ? (
            await manager.getRepository(Site).find({
              select: { id: true },
              where: { trialId: In(trialIds) },
            })
          ).map((s) => s.id)
        : [];
      const stripIds = siteIds.length
        ? (
            await manager.getRepository(Strip).find({
              select: { id: true },
              where: { siteId: In(siteIds) },
            })
          ).map((s) => s.id)
        : [];
      const attachments = siteIds.length
        ? await manager.getRepository(Attachment).find({
            select: { id: true, storedName: true },
            where: { siteId: In(siteIds) },
          })
        : [];
      storedNames.push(...attachments.map((a) => a.storedName));
      const memberships = await manager
        .getRepository(Membership)
        .find({ where: { networkId: network.id } });
      const invitations = await manager
        .getRepository(Invitation)
        .find({ select: { id: true }, where: { networkId: network.id } });
      // Audit rows have no foreign keys (history outlives rows), so they go by hand.
      const ids = [
        network.id,
        ...trialIds,
        ...siteIds,
        ...stripIds,
        ...attachments.map((a) => a.id),
        ...memberships.map((m) => m.id),
        ...invitations.map((i) => i.id),
      ];
      const audit = manager.getRepository(AuditEvent);
      for (let i = 0; i < ids.length; i += 5000)
        await audit.delete({ entityId: In(ids.slice(i, i + 5000)) });
      for (let i = 0; i < siteIds.length; i += 5000)
        await audit.delete({ siteId: In(siteIds.slice(i, i + 5000)) });
      // Sites first (with their strips, observations and photos): strips keep their rate level
      // from being deleted under them. Trials, rate levels, reports, memberships and invitations
      // then go with the network (ON DELETE CASCADE).
      for (let i = 0; i < siteIds.length; i += 5000)
        await manager.getRepository(Site).delete({ id: In(siteIds.slice(i, i + 5000)) });
      await manager.getRepository(Network).delete({ id: network.id });
      const formerIds = memberships.map((m) => m.userId).filter((id) => id !== input.actorUserId);
      let orphans: string[] = [];
      if (formerIds.length) {
        const stillIn = new Set(
          (
            await manager.getRepository(Membership).find({
              select: { userId: true },
              where: { userId: In(formerIds) },
            })
          ).map((m) => m.userId),
        );
        orphans = formerIds.filter((id) => !stillIn.has(id));
      }
      if (orphans.length) {
        await endSessionsOf(manager, orphans);
        await manager.getRepository(User).delete({ id: In(orphans) });
      }
      await recordAudit(manager, {
        actorUserId: input.actorUserId,
        entityType: 'network',
        entityId: network.id,
        action: 'deleted',
        before: { trials: trialIds.length, sites: siteIds.length, people: memberships.length },
      });
      return { deletedPhotos: attachments.length, deletedAccounts: orphans.length };
    });
    const folder = path.resolve(deps.uploadDir);
    await Promise.all(
      storedNames.map((name) => fs.rm(path.join(folder, path.basename(name)), { force: true })),
    );
    return result;
  }

  return { mine, create, remove };
}
