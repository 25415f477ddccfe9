// Counting requests against a limit in PostgreSQL, so every API process sees the same counts.
import type { DataSource } from 'typeorm';
import { LessThan } from 'typeorm';
import { RateLimitHit } from '../entities/rate-limit-hit.entity';

/**
 * Counts one request for `key` and answers the count in the current window and when it ends. A
 * window that has ended starts again at 1. One statement, so two processes never lose a count.
 */
export async function countHit(
  dataSource: DataSource,
  key: string,
  windowMs: number,
): Promise<{ hits: number; resetAt: Date }> {
  // Raw SQL: TypeORM's upsert cannot restart an expired window (a CASE in ON CONFLICT … DO UPDATE).
  const [row] = (await dataSource.query(
    `INSERT INTO rate_limit_hits AS h (key, hits, reset_at)
     VALUES ($1, 1, now() + $2 * interval '1 millisecond')
     ON CONFLICT (key) DO UPDATE SET
       hits = CASE WHEN h.reset_at <= now() THEN 1 ELSE h.hits + 1 END,
       reset_at = CASE WHEN h.reset_at <= now() THEN EXCLUDED.reset_at ELSE h.reset_at END
     RETURNING hits, reset_at`,
    [key, windowMs],
  )) as { hits: number; reset_at: Date }[];
  return { hits: row!.hits, resetAt: row!.reset_at };
}

export async function uncountHit(dataSource: DataSource, key: string): Promise<void> {
  await dataSource
    .getRepository(RateLimitHit)
    .createQueryBuilder()
    .update()
    .set({ hits: () => 'GREATEST(hits - 1, 0)' })
    .where('key = :key', { key })
    .execute();
}

export async function forgetHits(dataSource: DataSource, key: string): Promise<void> {
  await dataSource.getRepository(RateLimitHit).delete({ key });
}

/** Drops counters whose window ended a day ago or more (they would restart at 1 anyway). */
export async function pruneHits(dataSource: DataSource): Promise<void> {
  await dataSource
    .getRepository(RateLimitHit)
    .delete({ resetAt: LessThan(new Date(Date.now() - 24 * 60 * 60 * 1000)) });
}
