// Accounts: password checks, the session user with memberships, password reset by e-mail.
import bcrypt from 'bcryptjs';
import { IsNull, MoreThan, type DataSource } from 'typeorm';
import { Membership } from '../../db/entities/membership.entity';
import { PasswordResetToken } from '../../db/entities/password-reset-token.entity';
import { User } from '../../db/entities/user.entity';
import type { SessionUser } from '../../shared/schemas/auth';
import { endSessionsOf } from '../../db/repositories/user-sessions.repository';
import { AppError } from '../errors';
import { enqueueJob, type JobHandlers } from '../lib/job-runner';
import { composeMail, type Mailer } from '../mail/mailer';
import { hashPassword } from '../lib/passwords';
import { hashToken, newToken } from '../lib/tokens';

const RESET_LIFETIME_MS = 60 * 60 * 1000;
export const RESET_MAIL_JOB = 'password-reset-mail';

export function createAuthService(deps: {
  dataSource: DataSource;
  mailer: Mailer;
  publicUrl: string;
  /** bcrypt cost for new password hashes (config BCRYPT_COST). */
  passwordCost: number;
  /** The job queue this app's background mail goes to (tests give each app its own). */
  jobQueue?: string;
}) {
  const { dataSource, mailer, publicUrl } = deps;
  const users = dataSource.getRepository(User);
  const jobQueue = deps.jobQueue ?? 'default';
  // Compared against when the e-mail is unknown, so both failures take about as long.
  const dummyHash = bcrypt.hashSync('sheaf-timing-equaliser', deps.passwordCost);

  async function verifyPassword(email: string, password: string) {
    const user = await users.findOne({
      select: { id: true, email: true, name: true, passwordHash: true },
      where: { email: email.trim().toLowerCase() },
    });
    const ok = await bcrypt.compare(password, user?.passwordHash ?? dummyHash);
    if (!user || !ok) return null;
    return { id: user.id, email: user.email, name: user.name };
  }

  async function findSessionUser(id: string) {
    return users.findOne({ select: { id: true, email: true, name: true }, where: { id } });
  }

  async function describeUser(id: string): Promise<SessionUser> {
    const user = await findSessionUser(id);
    if (!user) throw new AppError(401, 'unauthenticated', 'Sign in to continue');
    const memberships = await dataSource
      .getRepository(Membership)
      .createQueryBuilder('m')
      .innerJoinAndSelect('m.network', 'n')
      .where('m.userId = :id', { id })
      .orderBy('n.name')
      .getMany();
    return {
      id: user.id,
      email: user.email,
      name: user.name,
      memberships: memberships.map((m) => ({
        networkId: m.networkId,
        networkName: m.network!.name,
        role: m.role,
      })),
    };
  }

  /**
   * Queues the reset mail and returns: known and unknown addresses cost the same one insert,
   * so the answer's timing says nothing about which addresses have accounts.
   */
  async function requestPasswordReset(email: string): Promise<void> {
    // No nudge to this process's runner: the mail goes out at the next poll of any worker, so
    // the work after a known address does not slow this process's next answers either.
    await enqueueJob(dataSource.manager, jobQueue, RESET_MAIL_JOB, { email });
  }

  /** The job: writes a token and sends the link when the address has an account. */
  async function sendPasswordResetMail(email: string): Promise<void> {
    const user = await users.findOne({ select: { id: true, name: true }, where: { email } });
    if (!user) return;
    const { token, hash } = newToken();
    await dataSource.getRepository(PasswordResetToken).insert({
      userId: user.id,
      tokenHash: hash,
      expiresAt: new Date(Date.now() + RESET_LIFETIME_MS),
    });
    await mailer.send(
      composeMail({
        to: email,
        subject: 'Reset your Sheaf password',
        paragraphs: [
          `Hello ${user.name},`,
          'Someone (hopefully you) asked to reset the password of your Sheaf account. The link works once and for one hour.',
        ],
        link: { label: 'Choose a new password', url: `${publicUrl}/reset/${token}` },
      }),
    );
  }

  async function completePasswordReset(token: string, password: string): Promise<void> {
    const passwordHash = await hashPassword(password, deps.passwordCost);
    await dataSource.transaction(async (manager) => {
      const tokens = manager.getRepository(PasswordResetToken);
      const row = await tokens.findOne({
        where: { tokenHash: hashToken(token), usedAt: IsNull(), expiresAt: MoreThan(new Date()) },
        lock: { mode: 'pessimistic_write' },
      });
      if (!row) {
        throw new AppError(
          400,
          'validation_failed',
          'This reset link is invalid, used or expired; ask for a new one',
          { fields: { token: 'invalid, used or expired' } },
        );
      }
      await manager.getRepository(User).update(row.userId, { passwordHash });
      await tokens.update({ userId: row.userId, usedAt: IsNull() }, { usedAt: new Date() });
      // Signing out everywhere: a reset usually means the old password leaked.
      await endSessionsOf(manager, [row.userId]);
    });
  }

  const jobHandlers: JobHandlers = {
    [RESET_MAIL_JOB]: (payload) => sendPasswordResetMail(String(payload.email)),
  };

  return {
    verifyPassword,
    findSessionUser,
    describeUser,
    requestPasswordReset,
    completePasswordReset,
    jobHandlers,
    jobQueue,
  };
}

export type AuthService = ReturnType<typeof createAuthService>;
