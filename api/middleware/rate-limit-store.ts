// A store for express-rate-limit that keeps its counts in PostgreSQL (its default keeps them in
// the process's memory, so with several API processes each would count only its own requests).
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { DataSource } from 'typeorm';
import {
  countHit,
  forgetHits,
  pruneHits,
  uncountHit,
} from '../../db/repositories/rate-limit-hits.repository';

export class PostgresRateLimitStore implements Store {
  private windowMs = 60_000;
  // Counts live in PostgreSQL, so this store may be shared by several limiters.
  localKeys = false;

  constructor(
    private readonly dataSource: DataSource,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const { hits, resetAt } = await countHit(this.dataSource, this.prefix + key, this.windowMs);
    // Now and then, clear out counters of clients who went away.
    if (Math.random() < 0.001) void pruneHits(this.dataSource).catch(() => {});
    return { totalHits: hits, resetTime: resetAt };
  }

  async decrement(key: string): Promise<void> {
    await uncountHit(this.dataSource, this.prefix + key);
  }

  async resetKey(key: string): Promise<void> {
    await forgetHits(this.dataSource, this.prefix + key);
  }
}
