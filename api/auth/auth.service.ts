// Accounts: password checks, the session user with memberships, password reset by e-mail.
import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import type { SessionUser } from '../../shared/schemas/auth';
import type { Role } from '../../shared/schemas/common';
import { AppError } from '../errors';
import { composeMail, type Mailer } from '../mail/mailer';
import { BCRYPT_COST, hashPassword } from '../lib/passwords';
import { hashToken, newToken } from '../lib/tokens';

const RESET_LIFETIME_MS = 60 * 60 * 1000;
// Compared against when the e-mail is unknown, so both failures take about as long.
const DUMMY_HASH = bcrypt.hashSync('sheaf-timing-equaliser', BCRYPT_COST);

export function createAuthService(deps: {
  dataSource: DataSource;
  mailer: Mailer;
  publicUrl: string;
}) {
  const { dataSource, mailer, publicUrl } = deps;

  async function verifyPassword(email: string, password: string) {
    const rows: { id: string; email: string; name: string; password_hash: string }[] =
      await dataSource.query('SELECT id, email, name, password_hash FROM users WHERE email = $1', [
        email.trim().toLowerCase(),
      ]);
    const user = rows[0];
    const ok = await bcrypt.compare(password, user?.password_hash ?? DUMMY_HASH);
    if (!user || !ok) return null;
    return { id: user.id, email: user.email, name: user.name };
  }

  async function findSessionUser(id: string) {
    const rows: { id: string; email: string; name: string }[] = await dataSource.query(
      'SELECT id, email, name FROM users WHERE id = $1',
      [id],
    );
    return rows[0] ?? null;
  }

  async function describeUser(id: string): Promise<SessionUser> {
    const user = await findSessionUser(id);
    if (!user) throw new AppError(401, 'unauthenticated', 'Sign in to continue');
    const memberships: { network_id: string; name: string; role: Role }[] = await dataSource.query(
      `SELECT m.network_id, n.name, m.role FROM memberships m JOIN networks n ON n.id = m.network_id
        WHERE m.user_id = $1 ORDER BY n.name`,
      [id],
    );
    return {
      ...user,
      memberships: memberships.map((m) => ({
        networkId: m.network_id,
        networkName: m.name,
        role: m.role,
      })),
    };
  }

  /** Sends a reset link when the address has an account; says nothing either way. */
  async function requestPasswordReset(email: string): Promise<void> {
    const rows: { id: string; name: string }[] = await dataSource.query(
      'SELECT id, name FROM users WHERE email = $1',
      [email],
    );
    const user = rows[0];
    if (!user) return;
    const { token, hash } = newToken();
    await dataSource.query(
      'INSERT INTO password_reset_tokens (user_id, token_hash, expires_at) VALUES ($1, $2, $3)',
      [user.id, hash, new Date(Date.now() + RESET_LIFETIME_MS)],
    );
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
    const passwordHash = await hashPassword(password);
    await dataSource.transaction(async (manager) => {
      const rows: { id: string; user_id: string }[] = await manager.query(
        `SELECT id, user_id FROM password_reset_tokens
          WHERE token_hash = $1 AND used_at IS NULL AND expires_at > now() FOR UPDATE`,
        [hashToken(token)],
      );
      const row = rows[0];
      if (!row) {
        throw new AppError(
          400,
          'validation_failed',
          'This reset link is invalid, used or expired; ask for a new one',
          {
            fields: { token: 'invalid, used or expired' },
          },
        );
      }
      await manager.query('UPDATE users SET password_hash = $1 WHERE id = $2', [
        passwordHash,
        row.user_id,
      ]);
      await manager.query(
        'UPDATE password_reset_tokens SET used_at = now() WHERE user_id = $1 AND used_at IS NULL',
        [row.user_id],
      );
      // Signing out everywhere: a reset usually means the old password leaked.
      await manager.query(`DELETE FROM user_sessions WHERE sess->'passport'->>'user' = $1`, [
        row.user_id,
      ]);
    });
  }

  return {
    verifyPassword,
    findSessionUser,
    describeUser,
    requestPasswordReset,
    completePasswordReset,
  };
}

export type AuthService = ReturnType<typeof createAuthService>;
