// Password hashing for accounts: one bcrypt cost for sign-up, invitations and password resets.
import bcrypt from 'bcryptjs';

export const BCRYPT_COST = 11;

/** Hashes a password with bcrypt at `BCRYPT_COST`; the cost is stored in the hash itself. */
export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST);
}
