// Password hashing for accounts: one bcrypt cost for sign-up, invitations and password resets.
import bcrypt from 'bcryptjs';

/** The bcrypt cost when BCRYPT_COST is not set; production refuses less than the minimum. */
export const DEFAULT_BCRYPT_COST = 11;
export const PRODUCTION_MIN_BCRYPT_COST = 10;

/** Hashes a password with bcrypt at the configured cost; the cost is stored in the hash itself. */
export function hashPassword(password: string, cost: number): Promise<string> {
  return bcrypt.hash(password, cost);
}
