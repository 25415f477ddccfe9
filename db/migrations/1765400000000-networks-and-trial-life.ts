// Many networks over many seasons: trial life cycle, growers' naming choice, lost sites,
// re-issued packets and pending sign-ups waiting for their e-mail confirmation.
import type { MigrationInterface, QueryRunner } from 'typeorm';

export class NetworksAndTrialLife1765400000000 implements MigrationInterface {
  name = 'NetworksAndTrialLife1765400000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      ALTER TABLE trials DROP CONSTRAINT IF EXISTS trials_status_check;
      UPDATE trials SET status = 'in-field' WHERE status = 'active';
      ALTER TABLE trials ADD CONSTRAINT trials_status_check
        CHECK (status IN ('draft', 'in-field', 'harvest-in', 'closed'));
      ALTER TABLE trials ADD COLUMN closed_at timestamptz;

      ALTER TABLE sites ADD COLUMN named_in_reports boolean NOT NULL DEFAULT false;
      ALTER TABLE sites ADD COLUMN report_number integer;
      ALTER TABLE sites ADD COLUMN lost_reason text;
      ALTER TABLE sites ADD COLUMN packet_reissued_at timestamptz;
      UPDATE sites s SET report_number = n.rn FROM (
        SELECT id, row_number() OVER (PARTITION BY trial_id ORDER BY created_at, id) AS rn FROM sites
      ) n WHERE n.id = s.id;
    `);
    // A trigger, not application code: every way a site is created (enrolment, imports, seeds,
    // tests) must get the next neutral label number of its trial, which TypeORM cannot express.
    await queryRunner.query(`
      CREATE FUNCTION sites_assign_report_number() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF NEW.report_number IS NULL THEN
          NEW.report_number := COALESCE(
            (SELECT max(report_number) FROM sites WHERE trial_id = NEW.trial_id), 0) + 1;
        END IF;
        RETURN NEW;
      END $$;
      CREATE TRIGGER sites_report_number BEFORE INSERT ON sites
        FOR EACH ROW EXECUTE FUNCTION sites_assign_report_number();
      ALTER TABLE sites ALTER COLUMN report_number SET NOT NULL;

      CREATE TABLE pending_sign_ups (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        email text NOT NULL,
        name text NOT NULL,
        password_hash text NOT NULL,
        network_name text NOT NULL,
        token_hash text NOT NULL UNIQUE,
        expires_at timestamptz NOT NULL,
        confirmed_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX pending_sign_ups_email_idx ON pending_sign_ups(email);
    `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      DROP TABLE pending_sign_ups;
      DROP TRIGGER sites_report_number ON sites;
      DROP FUNCTION sites_assign_report_number();
      ALTER TABLE sites DROP COLUMN packet_reissued_at, DROP COLUMN lost_reason,
        DROP COLUMN report_number, DROP COLUMN named_in_reports;
      ALTER TABLE trials DROP COLUMN closed_at;
      ALTER TABLE trials DROP CONSTRAINT trials_status_check;
      UPDATE trials SET status = 'active' WHERE status IN ('in-field', 'harvest-in');
      ALTER TABLE trials ADD CONSTRAINT trials_status_check CHECK (status IN ('draft', 'active', 'closed'));
    `);
  }
}
