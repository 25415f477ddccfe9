// People of a network: list members and open invitations, change a member's role, revoke an
// invitation. Coordinators move people between grower and member; only an admin grants or
// removes coordinator and admin, and the network always keeps at least one admin.
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/schemas/common';
import {
  grantableRoles,
  type NetworkMember,
  type NetworkPeople,
} from '../../shared/schemas/people';
import { recordAudit } from '../audit/audit.service';
import { Conflict, Forbidden, NotFound } from '../errors';

interface MemberRow {
  user_id: string;
  name: string;
  email: string;
  role: Role;
  site_count: number;
}

const MEMBER_SELECT = `
  SELECT u.id AS user_id, u.name, u.email, m.role,
         (SELECT count(*)::int FROM sites s JOIN trials t ON t.id = s.trial_id
           WHERE t.network_id = m.network_id AND s.grower_user_id = u.id) AS site_count
    FROM memberships m JOIN users u ON u.id = m.user_id
   WHERE m.network_id = $1`;

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
  async function list(networkId: string): Promise<NetworkPeople> {
    const members: MemberRow[] = await dataSource.query(
      `${MEMBER_SELECT} ORDER BY lower(u.name), u.email`,
      [networkId],
    );
    const invitations: {
      id: string;
      email: string;
      role: Role;
      expires_at: Date;
      created_at: Date;
    }[] = await dataSource.query(
      `SELECT id, email, role, expires_at, created_at FROM invitations
        WHERE network_id = $1 AND accepted_at IS NULL AND expires_at > now()
        ORDER BY created_at DESC`,
      [networkId],
    );
    return {
      members: members.map(presentMember),
      invitations: invitations.map((i) => ({
        id: i.id,
        email: i.email,
        role: i.role,
        expiresAt: new Date(i.expires_at).toISOString(),
        createdAt: new Date(i.created_at).toISOString(),
      })),
    };
  }

  async function changeRole(input: {
    networkId: string;
    userId: string;
    role: Role;
    actorUserId: string;
    actorRole: Role;
  }): Promise<NetworkMember> {
    return dataSource.transaction(async (manager) => {
      // Lock the network's memberships so two admins demoting each other cannot both succeed.
      const rows: { id: string; user_id: string; role: Role }[] = await manager.query(
        'SELECT id, user_id, role FROM memberships WHERE network_id = $1 ORDER BY id FOR UPDATE',
        [input.networkId],
      );
      const target = rows.find((r) => r.user_id === input.userId);
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
        await manager.query('UPDATE memberships SET role = $1 WHERE id = $2', [
          input.role,
          target.id,
        ]);
        await recordAudit(manager, {
          actorUserId: input.actorUserId,
          entityType: 'membership',
          entityId: target.id,
          action: 'role_changed',
          before: { userId: input.userId, networkId: input.networkId, role: target.role },
          after: { userId: input.userId, networkId: input.networkId, role: input.role },
        });
      }
      const updated: MemberRow[] = await manager.query(`${MEMBER_SELECT} AND m.user_id = $2`, [
        input.networkId,
        input.userId,
      ]);
      return presentMember(updated[0]!);
    });
  }

  async function revokeInvitation(input: {
    networkId: string;
    invitationId: string;
    actorUserId: string;
  }): Promise<void> {
    await dataSource.transaction(async (manager) => {
      const rows: { id: string; email: string; role: Role }[] = await manager.query(
        // WITH … SELECT: TypeORM answers a bare UPDATE … RETURNING with [rows, count].
        `WITH revoked AS (
           UPDATE invitations SET expires_at = now()
            WHERE id = $1 AND network_id = $2 AND accepted_at IS NULL AND expires_at > now()
            RETURNING id, email, role)
         SELECT id, email, role FROM revoked`,
        [input.invitationId, input.networkId],
      );
      const row = rows[0];
      if (!row) throw new NotFound('Invitation');
      await recordAudit(manager, {
        actorUserId: input.actorUserId,
        entityType: 'invitation',
        entityId: row.id,
        action: 'revoked',
        before: { email: row.email, role: row.role, networkId: input.networkId },
      });
    });
  }

  return { list, changeRole, revokeInvitation };
}
