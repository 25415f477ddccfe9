// Sign-in limiter: counts wrong passwords per (account, client address) and per address in
// PostgreSQL, so every worker process sees the same counts and a correct password never counts.
import { LessThan, type DataSource } from 'typeorm';
import { SignInFailure } from '../../db/entities/sign-in-failure.entity';

export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000;

export interface SignInLimiter {
  /** Whether this account may try from this address now (counts only wrong passwords). */
  isBlocked(account: string, address: string): Promise<boolean>;
  recordFailure(account: string, address: string): Promise<void>;
  /** A correct password clears that pair's failures. */
  recordSuccess(account: string, address: string): Promise<void>;
}

/**
 * @param limit wrong passwords allowed per account from one address in the window; one address
 *   may fail `limit × 5` times across all accounts (guessing many accounts from one place).
 */
export function createSignInLimiter(dataSource: DataSource, limit: number): SignInLimiter {
  const failures = dataSource.getRepository(SignInFailure);
  const since = () => new Date(Date.now() - SIGN_IN_WINDOW_MS);
  return {
    async isBlocked(account, address) {
      // One query for both counts: a correct sign-in then costs a single indexed read here.
      const counts = await failures
        .createQueryBuilder('f')
        .select('count(*) FILTER (WHERE f.account = :account)', 'pair')
        .addSelect('count(*)', 'fromAddress')
        .where('f.address = :address', { address })
        .andWhere('f.failedAt > :since', { since: since() })
        .setParameter('account', account)
        .getRawOne<{ pair: string; fromAddress: string }>();
      return Number(counts?.pair ?? 0) >= limit || Number(counts?.fromAddress ?? 0) >= limit * 5;
    },
    async recordFailure(account, address) {
      await failures.insert({ account, address });
      // Old rows only slow the counts down; drop them as new ones arrive.
      if (Math.random() < 0.05) await failures.delete({ failedAt: LessThan(since()) });
    },
    async recordSuccess(account, address) {
      await failures.delete({ account, address });
    },
  };
}
