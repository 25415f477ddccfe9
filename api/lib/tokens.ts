// Unguessable tokens for links sent by e-mail; only their SHA-256 is stored.
import crypto from 'node:crypto';

export function newToken(): { token: string; hash: string } {
  const token = crypto.randomBytes(32).toString('base64url');
  return { token, hash: hashToken(token) };
}

export function hashToken(token: string): string {
  return crypto.createHash('sha256').update(token).digest('hex');
}
