// Trials of one crop linked across seasons into a series, pooled by the series report.
import type { MigrationInterface, QueryRunner } from 'typeorm';

export class TrialSeries1765200000000 implements MigrationInterface {
  name = 'TrialSeries1765200000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE trial_series (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        network_id uuid NOT NULL REFERENCES networks(id) ON DELETE CASCADE,
        name text NOT NULL,
        crop text NOT NULL,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX trial_series_network_idx ON trial_series(network_id);
      ALTER TABLE trials ADD COLUMN series_id uuid REFERENCES trial_series(id) ON DELETE SET NULL;
      CREATE INDEX trials_series_idx ON trials(series_id);
    `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      DROP INDEX trials_series_idx;
      ALTER TABLE trials DROP COLUMN series_id;
      DROP TABLE trial_series;
    `);
  }
}
