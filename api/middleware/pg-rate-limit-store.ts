// An express-rate-limit store in PostgreSQL: fixed-window counters shared by every worker
// process (the package's default store keeps counts in one process's memory).
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { DataSource } from 'typeorm';
import { RateLimitCounter } from '../../db/entities/rate-limit-counter.entity';

export class PgRateLimitStore implements Store {
  private windowMs = 60_000;
  readonly localKeys = false;

  constructor(
    private readonly dataSource: DataSource,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = await this.dataSource
      .getRepository(RateLimitCounter)
      .findOneBy({ key: this.prefix + key });
    if (!row || row.resetAt.getTime() <= Date.now()) return undefined;
    return { totalHits: row.hits, resetTime: row.resetAt };
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    // Raw SQL: one atomic upsert that restarts an expired window; TypeORM's orUpdate cannot say
    // CASE on the existing row.
    const rows: { hits: number; reset_at: Date }[] = await this.dataSource.query(
      `INSERT INTO rate_limit_counters AS c (key, hits, reset_at)
       VALUES ($1, 1, now() + $2 * interval '1 millisecond')
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN c.reset_at <= now() THEN 1 ELSE c.hits + 1 END,
         reset_at = CASE WHEN c.reset_at <= now() THEN EXCLUDED.reset_at ELSE c.reset_at END
       RETURNING hits, reset_at`,
      [this.prefix + key, this.windowMs],
    );
    const row = rows[0]!;
    return { totalHits: row.hits, resetTime: row.reset_at };
  }

  async decrement(key: string): Promise<void> {
    await this.dataSource
      .getRepository(RateLimitCounter)
      .createQueryBuilder()
      .update()
      .set({ hits: () => 'GREATEST(hits - 1, 0)' })
      .where('key = :key', { key: this.prefix + key })
      .execute();
  }

  async resetKey(key: string): Promise<void> {
    await this.dataSource.getRepository(RateLimitCounter).delete({ key: this.prefix + key });
  }
}
