// First schema: accounts, networks, trials, sites, strips, observations, reports, audit.
import type { MigrationInterface, QueryRunner } from 'typeorm';

export class InitialSchema1764633600000 implements MigrationInterface {
  name = 'InitialSchema1764633600000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE users (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        email text NOT NULL UNIQUE,
        name text NOT NULL,
        password_hash text NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE TABLE networks (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        name text NOT NULL,
        slug text NOT NULL UNIQUE,
        is_demo boolean NOT NULL DEFAULT false,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE TABLE memberships (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        network_id uuid NOT NULL REFERENCES networks(id) ON DELETE CASCADE,
        role text NOT NULL CHECK (role IN ('admin', 'coordinator', 'grower', 'member')),
        created_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (user_id, network_id)
      );
      CREATE INDEX memberships_network_idx ON memberships(network_id);
      CREATE TABLE trials (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        network_id uuid NOT NULL REFERENCES networks(id) ON DELETE CASCADE,
        name text NOT NULL,
        question text NOT NULL DEFAULT '',
        status text NOT NULL DEFAULT 'draft' CHECK (status IN ('draft', 'active', 'closed')),
        crop text,
        custom_crop jsonb,
        season text,
        unit_system text NOT NULL DEFAULT 'imperial' CHECK (unit_system IN ('imperial', 'metric')),
        reference_rate numeric,
        reference_unit text,
        blocks_per_site integer,
        rows_per_strip integer,
        row_spacing_in numeric,
        strip_length_ft numeric,
        border_rows integer,
        thousand_kernel_weight_g numeric,
        germination_pct numeric,
        emergence_pct numeric,
        seed_price_per_lb numeric,
        grain_price_per_bu numeric,
        public_link_token text UNIQUE,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX trials_network_idx ON trials(network_id);
      CREATE TABLE rate_levels (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        trial_id uuid NOT NULL REFERENCES trials(id) ON DELETE CASCADE,
        position integer NOT NULL,
        multiplier numeric NOT NULL CHECK (multiplier > 0),
        label text NOT NULL,
        UNIQUE (trial_id, position)
      );
      CREATE TABLE sites (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        trial_id uuid NOT NULL REFERENCES trials(id) ON DELETE CASCADE,
        grower_user_id uuid REFERENCES users(id) ON DELETE SET NULL,
        grower_email text,
        field_name text NOT NULL,
        soil text NOT NULL DEFAULT '',
        previous_crop text NOT NULL DEFAULT '',
        fertility text NOT NULL DEFAULT '',
        notes text NOT NULL DEFAULT '',
        randomization_seed text,
        randomized_at timestamptz,
        sowing_date date,
        emergence_date date,
        heading_date date,
        harvest_date date,
        calibrations jsonb NOT NULL DEFAULT '[]',
        published_at timestamptz,
        data_version integer NOT NULL DEFAULT 0,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX sites_trial_idx ON sites(trial_id);
      CREATE INDEX sites_grower_idx ON sites(grower_user_id);
      CREATE TABLE strips (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
        block integer NOT NULL CHECK (block >= 1),
        position integer NOT NULL CHECK (position >= 1),
        rate_level_id uuid NOT NULL REFERENCES rate_levels(id) ON DELETE RESTRICT,
        version integer NOT NULL DEFAULT 1,
        UNIQUE (site_id, block, position)
      );
      CREATE TABLE observations (
        strip_id uuid PRIMARY KEY REFERENCES strips(id) ON DELETE CASCADE,
        seeds_sown integer,
        stand_counts jsonb NOT NULL DEFAULT '[]',
        stand_row_length numeric,
        tiller_plants integer,
        tiller_count integer,
        head_counts jsonb NOT NULL DEFAULT '[]',
        head_row_length numeric,
        grain_weight numeric,
        harvest_rows integer,
        harvest_length numeric,
        harvest_area numeric,
        moisture_pct numeric,
        test_weight numeric,
        sowing_date date,
        emergence_date date,
        heading_date date,
        harvest_date date,
        notes text NOT NULL DEFAULT '',
        updated_by uuid REFERENCES users(id) ON DELETE SET NULL,
        updated_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE TABLE attachments (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
        strip_id uuid REFERENCES strips(id) ON DELETE CASCADE,
        uploaded_by uuid REFERENCES users(id) ON DELETE SET NULL,
        stored_name text NOT NULL UNIQUE,
        original_name text NOT NULL,
        mime_type text NOT NULL,
        size_bytes integer NOT NULL,
        caption text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX attachments_site_idx ON attachments(site_id);
      CREATE TABLE invitations (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        network_id uuid NOT NULL REFERENCES networks(id) ON DELETE CASCADE,
        email text NOT NULL,
        role text NOT NULL CHECK (role IN ('admin', 'coordinator', 'grower', 'member')),
        token_hash text NOT NULL UNIQUE,
        invited_by uuid REFERENCES users(id) ON DELETE SET NULL,
        site_id uuid REFERENCES sites(id) ON DELETE SET NULL,
        expires_at timestamptz NOT NULL,
        accepted_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE TABLE password_reset_tokens (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        token_hash text NOT NULL UNIQUE,
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE TABLE audit_events (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        actor_user_id uuid REFERENCES users(id) ON DELETE SET NULL,
        entity_type text NOT NULL,
        entity_id uuid NOT NULL,
        site_id uuid,
        action text NOT NULL,
        before jsonb,
        after jsonb,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX audit_events_entity_idx ON audit_events(entity_type, entity_id);
      CREATE INDEX audit_events_site_idx ON audit_events(site_id);
      CREATE TABLE report_snapshots (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        scope text NOT NULL CHECK (scope IN ('site', 'pooled')),
        trial_id uuid NOT NULL REFERENCES trials(id) ON DELETE CASCADE,
        site_id uuid REFERENCES sites(id) ON DELETE CASCADE,
        data_version text NOT NULL,
        report jsonb NOT NULL,
        published_by uuid REFERENCES users(id) ON DELETE SET NULL,
        published_at timestamptz NOT NULL DEFAULT now(),
        withdrawn_at timestamptz
      );
      CREATE INDEX report_snapshots_trial_idx ON report_snapshots(trial_id, scope);
      CREATE INDEX report_snapshots_site_idx ON report_snapshots(site_id);
      CREATE TABLE user_sessions (
        sid varchar NOT NULL PRIMARY KEY,
        sess json NOT NULL,
        expire timestamp(6) NOT NULL
      );
      CREATE INDEX user_sessions_expire_idx ON user_sessions(expire);
    `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      DROP TABLE user_sessions; DROP TABLE report_snapshots; DROP TABLE audit_events;
      DROP TABLE password_reset_tokens; DROP TABLE invitations; DROP TABLE attachments;
      DROP TABLE observations; DROP TABLE strips; DROP TABLE sites; DROP TABLE rate_levels;
      DROP TABLE trials; DROP TABLE memberships; DROP TABLE networks; DROP TABLE users;
    `);
  }
}
