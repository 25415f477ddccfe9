// Request counters for rate limits, shared by every API process (they lived in each process's memory).
import type { MigrationInterface, QueryRunner } from 'typeorm';

export class RateLimitHits1765000000000 implements MigrationInterface {
  name = 'RateLimitHits1765000000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE rate_limit_hits (
        key text PRIMARY KEY,
        hits integer NOT NULL,
        reset_at timestamptz NOT NULL
      );
      CREATE INDEX rate_limit_hits_reset_idx ON rate_limit_hits(reset_at);
    `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE rate_limit_hits');
  }
}
