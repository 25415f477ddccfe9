// Sign-up: a person gives name, e-mail, password and a network name; the account and the
// network are created only when the link e-mailed to that address is opened.
import type { DataSource } from 'typeorm';
import type { SignUpInput } from '../../shared/schemas/network';
import { PendingSignUp } from '../../db/entities/pending-sign-up.entity';
import { User } from '../../db/entities/user.entity';
import { AppError, Conflict, Forbidden } from '../errors';
import { hashToken, newToken } from '../lib/tokens';
import { composeMail, type Mailer } from '../mail/mailer';
import { startNetwork } from '../lib/start-network';
import { hashPassword } from '../lib/passwords';

const CONFIRM_LIFETIME_MS = 48 * 60 * 60 * 1000;

export function createSignUpService(deps: {
  dataSource: DataSource;
  mailer: Mailer;
  publicUrl: string;
  /** bcrypt cost for new password hashes (config BCRYPT_COST). */
  passwordCost: number;
  open: boolean;
}) {
  const { dataSource, mailer } = deps;
  const base = deps.publicUrl.replace(/\/$/, '');

  /**
   * Records the sign-up and e-mails a confirmation link. Answers the same whether or not the
   * address already has an account (that person gets a note to sign in instead).
   */
  async function signUp(input: SignUpInput): Promise<void> {
    if (!deps.open)
      throw new Forbidden(
        'This Sheaf is invite-only: ask a network’s coordinator for an invitation',
      );
    const existing = await dataSource.getRepository(User).findOneBy({ email: input.email });
    if (existing) {
      await mailer.send(
        composeMail({
          to: input.email,
          subject: 'You already have a Sheaf account',
          paragraphs: [
            `Hello ${existing.name},`,
            `Someone (hopefully you) tried to sign up with this address to start the network “${input.networkName}”. You already have an account: sign in, then choose “Start another network” from the network menu at the top of the page.`,
            'If this was not you, nothing needs doing.',
          ],
          link: { label: 'Sign in', url: `${base}/login` },
        }),
      );
      return;
    }
    const { token, hash } = newToken();
    await dataSource.getRepository(PendingSignUp).insert({
      email: input.email,
      name: input.name,
      passwordHash: await hashPassword(input.password, deps.passwordCost),
      networkName: input.networkName,
      tokenHash: hash,
      expiresAt: new Date(Date.now() + CONFIRM_LIFETIME_MS),
    });
    await mailer.send(
      composeMail({
        to: input.email,
        subject: `Confirm your e-mail to start “${input.networkName}” on Sheaf`,
        paragraphs: [
          `Hello ${input.name},`,
          `Open the link below within 48 hours to confirm this address. Sheaf then creates your account and the network “${input.networkName}”, with you as its admin.`,
          'If you did not sign up, ignore this e-mail: nothing is created without the link.',
        ],
        link: { label: 'Confirm and start the network', url: `${base}/sign-up/confirm/${token}` },
      }),
    );
  }

  /** Creates the account and its network from a confirmation link; returns the new user's id. */
  async function confirm(token: string): Promise<string> {
    return dataSource.transaction(async (manager) => {
      const pending = await manager
        .getRepository(PendingSignUp)
        .createQueryBuilder('p')
        .setLock('pessimistic_write')
        .where('p.token_hash = :hash', { hash: hashToken(token) })
        .andWhere('p.confirmed_at IS NULL AND p.expires_at > now()')
        .getOne();
      if (!pending) {
        throw new AppError(
          400,
          'validation_failed',
          'This confirmation link is invalid, used or expired; sign up again',
          { fields: { token: 'invalid, used or expired' } },
        );
      }
      const users = manager.getRepository(User);
      if (await users.findOneBy({ email: pending.email }))
        throw new Conflict('This address already has an account: sign in instead');
      const user = await users.save(
        users.create({
          email: pending.email,
          name: pending.name,
          passwordHash: pending.passwordHash,
        }),
      );
      await startNetwork(manager, pending.networkName, user.id);
      await manager
        .getRepository(PendingSignUp)
        .update({ email: pending.email }, { confirmedAt: () => 'now()' });
      return user.id;
    });
  }

  return { signUp, confirm, open: deps.open };
}
