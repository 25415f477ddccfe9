// Shared state for several worker processes: sign-in failures, the job
// queue, idempotency keys and stored report PDFs; photo thumbnails.
import type { MigrationInterface, QueryRunner } from 'typeorm';

export class SecurityTables1765100000000 implements MigrationInterface {
  name = 'SecurityTables1765100000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE sign_in_failures (
        id bigserial PRIMARY KEY,
        account text NOT NULL,
        address text NOT NULL,
        failed_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX sign_in_failures_account_address ON sign_in_failures (account, address, failed_at);
      CREATE INDEX sign_in_failures_address ON sign_in_failures (address, failed_at);
      CREATE INDEX sign_in_failures_failed_at ON sign_in_failures (failed_at);

      CREATE TABLE jobs (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        queue text NOT NULL DEFAULT 'default',
        kind text NOT NULL,
        payload jsonb NOT NULL DEFAULT '{}',
        run_at timestamptz NOT NULL DEFAULT now(),
        attempts integer NOT NULL DEFAULT 0,
        locked_until timestamptz,
        done_at timestamptz,
        last_error text,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX jobs_waiting ON jobs (queue, run_at) WHERE done_at IS NULL;

      CREATE TABLE idempotency_keys (
        scope text NOT NULL,
        key text NOT NULL,
        method text NOT NULL,
        path text NOT NULL,
        request_hash text NOT NULL,
        status integer,
        content_type text,
        body bytea,
        created_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (scope, key)
      );
      CREATE INDEX idempotency_keys_created_at ON idempotency_keys (created_at);

      CREATE TABLE report_pdfs (
        digest text PRIMARY KEY,
        pdf bytea NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      );

      ALTER TABLE attachments ADD COLUMN thumbnail_name text;
    `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      ALTER TABLE attachments DROP COLUMN thumbnail_name;
      DROP TABLE report_pdfs; DROP TABLE idempotency_keys; DROP TABLE jobs;
      DROP TABLE sign_in_failures;
    `);
  }
}
