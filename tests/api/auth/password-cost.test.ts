// The bcrypt cost comes from BCRYPT_COST: tests lower it, production refuses a weak one.
import bcrypt from 'bcryptjs';
import { describe, expect, it } from 'vitest';
import { readConfig } from '../../../api/config/env';
import { hashPassword } from '../../../api/lib/passwords';

const base = {
  DATABASE_URL: 'postgres://sheaf@127.0.0.1:5432/sheaf',
  SESSION_SECRET: 'a-session-secret-of-enough-length',
};

describe('password hashing cost', () => {
  it('defaults to 11 and refuses less than 10 in production, naming the setting', () => {
    expect(readConfig({ ...base }).BCRYPT_COST).toBe(11);
    expect(readConfig({ ...base, NODE_ENV: 'production' }).BCRYPT_COST).toBe(11);
    expect(() => readConfig({ ...base, NODE_ENV: 'production', BCRYPT_COST: '4' })).toThrow(
      /BCRYPT_COST: must be at least 10 in production/,
    );
    expect(readConfig({ ...base, NODE_ENV: 'test', BCRYPT_COST: '4' }).BCRYPT_COST).toBe(4);
  });

  it('stores the cost in the hash, so sign-in checks old and new hashes alike', async () => {
    // Source: OpenBSD bcrypt(3) manual: "$2b$" then the two-digit log2 cost, then salt and hash.
    const cheap = await hashPassword('correct horse', 4);
    const dear = await hashPassword('correct horse', 10);
    expect(cheap.slice(0, 7)).toBe('$2b$04$');
    expect(dear.slice(0, 7)).toBe('$2b$10$');
    expect(await bcrypt.compare('correct horse', dear)).toBe(true);
    expect(await bcrypt.compare('correct horsE', cheap)).toBe(false);
  });
});
