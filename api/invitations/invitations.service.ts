// Invitations: a coordinator invites an e-mail address to a network with a role; the link
// lets the person set their name and password and signs them in.
import { In, IsNull, MoreThan, type DataSource, type EntityManager } from 'typeorm';
import { Invitation } from '../../db/entities/invitation.entity';
import { Membership } from '../../db/entities/membership.entity';
import { Network } from '../../db/entities/network.entity';
import { Site } from '../../db/entities/site.entity';
import { Trial } from '../../db/entities/trial.entity';
import { User } from '../../db/entities/user.entity';
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
  /** bcrypt cost for new password hashes (config BCRYPT_COST). */
  passwordCost: number;
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
    const network = await db
      .getRepository(Network)
      .findOne({ select: { id: true, name: true }, where: { id: input.networkId } });
    if (!network) throw new NotFound('Network');
    const alreadyMember = await db
      .getRepository(Membership)
      .exists({ where: { networkId: input.networkId, user: { email: input.email } } });
    if (alreadyMember && !input.siteId)
      throw new Conflict('That person is already in this network');
    const { token, hash } = newToken();
    const expiresAt = new Date(Date.now() + INVITATION_LIFETIME_MS);
    const created = await db.getRepository(Invitation).insert({
      networkId: input.networkId,
      email: input.email,
      role: input.role,
      tokenHash: hash,
      invitedBy: input.invitedBy,
      siteId: input.siteId ?? null,
      expiresAt,
    });
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
      id: created.identifiers[0]!.id as string,
      email: input.email,
      role: input.role,
      expiresAt: expiresAt.toISOString(),
      token,
    };
  }

  /** The invitation with its network, while it is neither accepted nor expired. */
  function findOpen(token: string, db: EntityManager = dataSource.manager) {
    return db.getRepository(Invitation).findOne({
      relations: { network: true },
      where: { tokenHash: hashToken(token), acceptedAt: IsNull(), expiresAt: MoreThan(new Date()) },
    });
  }

  async function preview(token: string): Promise<InvitationPreview> {
    const row = await findOpen(token);
    if (!row) throw new NotFound('Invitation');
    return {
      email: row.email,
      role: row.role,
      networkName: row.network!.name,
      expiresAt: row.expiresAt.toISOString(),
    };
  }

  /** Creates the account (or adds the membership) and returns the user id to sign in. */
  async function accept(input: InvitationAccept): Promise<string> {
    const passwordHash = await hashPassword(input.password, deps.passwordCost);
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
      if (await manager.getRepository(User).exists({ where: { email: row.email } })) {
        throw new Conflict(
          'This e-mail already has an account: sign in instead and ask the coordinator to add you',
        );
      }
      const created = await manager
        .getRepository(User)
        .insert({ email: row.email, name: input.name, passwordHash });
      const userId = created.identifiers[0]!.id as string;
      await manager
        .createQueryBuilder()
        .insert()
        .into(Membership)
        .values({ userId, networkId: row.networkId, role: row.role })
        .orIgnore()
        .execute();
      // Sites enrolled for this address now belong to the new account.
      const trials = await manager
        .getRepository(Trial)
        .find({ select: { id: true }, where: { networkId: row.networkId } });
      if (trials.length > 0)
        await manager.getRepository(Site).update(
          {
            growerEmail: row.email,
            growerUserId: IsNull(),
            trialId: In(trials.map((t) => t.id)),
          },
          { growerUserId: userId, growerEmail: null },
        );
      await manager
        .getRepository(Invitation)
        .update(
          { email: row.email, networkId: row.networkId, acceptedAt: IsNull() },
          { acceptedAt: new Date() },
        );
      return userId;
    });
  }

  return { invite, preview, accept };
}

export type InvitationsService = ReturnType<typeof createInvitationsService>;
