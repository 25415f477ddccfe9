// Invitations: a coordinator invites an e-mail address to a network with a role; the link
// lets the person set their name and password and signs them in.
import type { DataSource, EntityManager } from 'typeorm';
import type { InvitationAccept, InvitationPreview } from '../../shared/schemas/auth';
import type { Role } from '../../shared/schemas/common';
import { AppError, Conflict, Forbidden, NotFound } from '../errors';
import { composeMail, type Mailer } from '../mail/mailer';
import { hashPassword } from '../lib/passwords';
import { hashToken, newToken } from '../lib/tokens';

const INVITATION_LIFETIME_MS = 14 * 24 * 60 * 60 * 1000;

export function createInvitationsService(deps: {
  dataSource: DataSource;
  mailer: Mailer;
  publicUrl: string;
}) {
  const { dataSource, mailer, publicUrl } = deps;

  /**
   * Creates an invitation and e-mails its link. Used by the invitations route and by site
   * enrolment (with siteId and a message about the trial).
   */
  async function invite(input: {
    networkId: string;
    email: string;
    role: Role;
    invitedBy: string;
    inviterRole: Role;
    siteId?: string | null;
    trialName?: string;
    manager?: EntityManager;
  }) {
    if ((input.role === 'admin' || input.role === 'coordinator') && input.inviterRole !== 'admin') {
      throw new Forbidden('Only an admin can invite coordinators and admins');
    }
    const db = input.manager ?? dataSource.manager;
    const networkRows: { name: string }[] = await db.query(
      'SELECT name FROM networks WHERE id = $1',
      [input.networkId],
    );
    const network = networkRows[0];
    if (!network) throw new NotFound('Network');
    const existing = await db.query(
      `SELECT 1 FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = $1 AND m.network_id = $2`,
      [input.email, input.networkId],
    );
    if (existing.length > 0 && !input.siteId)
      throw new Conflict('That person is already in this network');
    const { token, hash } = newToken();
    const expiresAt = new Date(Date.now() + INVITATION_LIFETIME_MS);
    const rows: { id: string }[] = await db.query(
      `INSERT INTO invitations (network_id, email, role, token_hash, invited_by, site_id, expires_at)
       VALUES ($1, $2, $3, $4, $5, $6, $7) RETURNING id`,
      [
        input.networkId,
        input.email,
        input.role,
        hash,
        input.invitedBy,
        input.siteId ?? null,
        expiresAt,
      ],
    );
    const trialLine = input.trialName
      ? `You have been enrolled as the grower of a site in the seeding-rate trial "${input.trialName}".`
      : `You have been invited to join ${network.name} on Sheaf as a ${input.role}.`;
    await mailer.send(
      composeMail({
        to: input.email,
        subject: input.trialName
          ? `Join the trial "${input.trialName}" on Sheaf`
          : `Join ${network.name} on Sheaf`,
        paragraphs: [
          'Hello,',
          trialLine,
          `${network.name} uses Sheaf to plan seeding-rate strips, collect counts and yields, and share the results. Open the link to set your name and password; it works for 14 days.`,
        ],
        link: { label: 'Accept the invitation', url: `${publicUrl}/invite/${token}` },
      }),
    );
    return {
      id: rows[0]!.id,
      email: input.email,
      role: input.role,
      expiresAt: expiresAt.toISOString(),
      token,
    };
  }

  async function findOpen(token: string, db: EntityManager = dataSource.manager) {
    const rows: {
      id: string;
      network_id: string;
      email: string;
      role: Role;
      expires_at: Date;
      name: string;
    }[] = await db.query(
      `SELECT i.id, i.network_id, i.email, i.role, i.expires_at, n.name
         FROM invitations i JOIN networks n ON n.id = i.network_id
        WHERE i.token_hash = $1 AND i.accepted_at IS NULL AND i.expires_at > now()`,
      [hashToken(token)],
    );
    return rows[0] ?? null;
  }

  async function preview(token: string): Promise<InvitationPreview> {
    const row = await findOpen(token);
    if (!row) throw new NotFound('Invitation');
    return {
      email: row.email,
      role: row.role,
      networkName: row.name,
      expiresAt: new Date(row.expires_at).toISOString(),
    };
  }

  /** Creates the account (or adds the membership) and returns the user id to sign in. */
  async function accept(input: InvitationAccept): Promise<string> {
    const passwordHash = await hashPassword(input.password);
    return dataSource.transaction(async (manager) => {
      const row = await findOpen(input.token, manager);
      if (!row) {
        throw new AppError(
          400,
          'validation_failed',
          'This invitation is invalid, used or expired; ask your coordinator for a new one',
          {
            fields: { token: 'invalid, used or expired' },
          },
        );
      }
      const users: { id: string }[] = await manager.query('SELECT id FROM users WHERE email = $1', [
        row.email,
      ]);
      let userId = users[0]?.id;
      if (userId) {
        throw new Conflict(
          'This e-mail already has an account: sign in instead and ask the coordinator to add you',
        );
      }
      const created: { id: string }[] = await manager.query(
        'INSERT INTO users (email, name, password_hash) VALUES ($1, $2, $3) RETURNING id',
        [row.email, input.name, passwordHash],
      );
      userId = created[0]!.id;
      await manager.query(
        `INSERT INTO memberships (user_id, network_id, role) VALUES ($1, $2, $3)
         ON CONFLICT (user_id, network_id) DO NOTHING`,
        [userId, row.network_id, row.role],
      );
      // Sites enrolled for this address now belong to the new account.
      await manager.query(
        `UPDATE sites SET grower_user_id = $1, grower_email = NULL
          WHERE grower_email = $2 AND grower_user_id IS NULL
            AND trial_id IN (SELECT id FROM trials WHERE network_id = $3)`,
        [userId, row.email, row.network_id],
      );
      await manager.query(
        'UPDATE invitations SET accepted_at = now() WHERE email = $1 AND network_id = $2 AND accepted_at IS NULL',
        [row.email, row.network_id],
      );
      return userId;
    });
  }

  return { invite, preview, accept };
}

export type InvitationsService = ReturnType<typeof createInvitationsService>;
