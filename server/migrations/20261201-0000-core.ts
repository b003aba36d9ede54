import type { QueryInterface } from 'sequelize';

// The core schema: shops, people, vehicles, procedures and their versions, diagnoses and their
// steps, photos, coaching notes, the audit log and the session store. Every row of shop data
// carries shop_id so that every query can be scoped to one shop.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE shops (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      slug text NOT NULL UNIQUE,
      settings jsonb NOT NULL DEFAULT '{}'::jsonb,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TABLE users (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      email text NOT NULL UNIQUE CHECK (email = lower(email)),
      name text NOT NULL,
      password_hash text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TABLE memberships (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id) ON DELETE CASCADE,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      roles text[] NOT NULL CHECK (roles <@ ARRAY['admin','author','lead','technician','trainer']::text[]),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (shop_id, user_id)
    );
    CREATE INDEX memberships_user_idx ON memberships (user_id);
    CREATE TABLE invitations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id) ON DELETE CASCADE,
      email text NOT NULL,
      name text NOT NULL DEFAULT '',
      roles text[] NOT NULL,
      token_hash text NOT NULL UNIQUE,
      invited_by uuid REFERENCES users(id) ON DELETE SET NULL,
      expires_at timestamptz NOT NULL,
      accepted_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX invitations_shop_idx ON invitations (shop_id, created_at DESC);
    CREATE TABLE password_resets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      token_hash text NOT NULL UNIQUE,
      expires_at timestamptz NOT NULL,
      used_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TABLE vehicles (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id) ON DELETE CASCADE,
      label text NOT NULL,
      model text NOT NULL DEFAULT '',
      frame_number text NOT NULL DEFAULT '',
      hours numeric(10,1),
      notes text NOT NULL DEFAULT '',
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (shop_id, label)
    );
    CREATE TABLE meters (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id) ON DELETE CASCADE,
      name text NOT NULL,
      spec jsonb NOT NULL DEFAULT '{}'::jsonb,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (shop_id, name)
    );
    CREATE TABLE procedures (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id) ON DELETE CASCADE,
      slug text NOT NULL,
      title text NOT NULL,
      symptom text NOT NULL,
      ignition_system text NOT NULL DEFAULT '',
      archived_at timestamptz,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (shop_id, slug)
    );
    CREATE TABLE procedure_versions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id) ON DELETE CASCADE,
      procedure_id uuid NOT NULL REFERENCES procedures(id) ON DELETE CASCADE,
      number integer,
      status text NOT NULL CHECK (status IN ('draft','in_review','published','retired')),
      document jsonb NOT NULL,
      lock_version integer NOT NULL DEFAULT 1,
      lint_report jsonb NOT NULL DEFAULT '[]'::jsonb,
      based_on_id uuid REFERENCES procedure_versions(id) ON DELETE SET NULL,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      updated_by uuid REFERENCES users(id) ON DELETE SET NULL,
      published_by uuid REFERENCES users(id) ON DELETE SET NULL,
      published_at timestamptz,
      retired_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (procedure_id, number),
      CHECK ((status IN ('published','retired')) = (number IS NOT NULL))
    );
    -- at most one open draft (draft or in review) per procedure
    CREATE UNIQUE INDEX procedure_versions_one_open_draft ON procedure_versions (procedure_id)
      WHERE status IN ('draft','in_review');
    CREATE INDEX procedure_versions_shop_idx ON procedure_versions (shop_id, status);
    CREATE TABLE review_comments (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id) ON DELETE CASCADE,
      procedure_version_id uuid NOT NULL REFERENCES procedure_versions(id) ON DELETE CASCADE,
      author_id uuid REFERENCES users(id) ON DELETE SET NULL,
      step_id text,
      body text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX review_comments_version_idx ON review_comments (procedure_version_id, created_at);
    CREATE TABLE diagnoses (
      id uuid PRIMARY KEY,
      shop_id uuid NOT NULL REFERENCES shops(id) ON DELETE CASCADE,
      procedure_version_id uuid NOT NULL REFERENCES procedure_versions(id),
      vehicle_id uuid NOT NULL REFERENCES vehicles(id),
      technician_id uuid NOT NULL REFERENCES users(id),
      meter_id uuid REFERENCES meters(id) ON DELETE SET NULL,
      status text NOT NULL DEFAULT 'active' CHECK (status IN ('active','finished','handed_off','abandoned')),
      complaint text NOT NULL DEFAULT '',
      conditions jsonb NOT NULL DEFAULT '{}'::jsonb,
      ending_step_id text,
      outcome jsonb,
      started_at timestamptz NOT NULL DEFAULT now(),
      ended_at timestamptz,
      last_activity_at timestamptz NOT NULL DEFAULT now(),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX diagnoses_shop_status_idx ON diagnoses (shop_id, status, started_at DESC);
    CREATE INDEX diagnoses_version_idx ON diagnoses (procedure_version_id, started_at);
    CREATE INDEX diagnoses_vehicle_idx ON diagnoses (vehicle_id, started_at);
    CREATE INDEX diagnoses_technician_idx ON diagnoses (technician_id, started_at DESC);
    CREATE TABLE diagnosis_steps (
      id uuid PRIMARY KEY,
      shop_id uuid NOT NULL REFERENCES shops(id) ON DELETE CASCADE,
      diagnosis_id uuid NOT NULL REFERENCES diagnoses(id) ON DELETE CASCADE,
      seq integer NOT NULL,
      step_id text NOT NULL,
      kind text NOT NULL,
      shown jsonb NOT NULL DEFAULT '{}'::jsonb,
      entered text,
      value double precision,
      unit text,
      verdict text,
      band_id text,
      answer_id text,
      superseded boolean NOT NULL DEFAULT false,
      note text NOT NULL DEFAULT '',
      started_at timestamptz NOT NULL,
      answered_at timestamptz NOT NULL,
      payload_hash text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX diagnosis_steps_diagnosis_idx ON diagnosis_steps (diagnosis_id, seq);
    CREATE TABLE attachments (
      id uuid PRIMARY KEY,
      shop_id uuid NOT NULL REFERENCES shops(id) ON DELETE CASCADE,
      diagnosis_id uuid NOT NULL REFERENCES diagnoses(id) ON DELETE CASCADE,
      step_id text,
      object_key text NOT NULL,
      thumb_key text,
      content_type text NOT NULL,
      byte_size integer NOT NULL,
      original_name text NOT NULL DEFAULT '',
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX attachments_diagnosis_idx ON attachments (diagnosis_id);
    CREATE TABLE coaching_notes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id) ON DELETE CASCADE,
      diagnosis_id uuid NOT NULL REFERENCES diagnoses(id) ON DELETE CASCADE,
      step_id text,
      author_id uuid REFERENCES users(id) ON DELETE SET NULL,
      body text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX coaching_notes_diagnosis_idx ON coaching_notes (diagnosis_id, created_at);
    CREATE TABLE audit_log (
      id bigserial PRIMARY KEY,
      shop_id uuid REFERENCES shops(id) ON DELETE CASCADE,
      user_id uuid REFERENCES users(id) ON DELETE SET NULL,
      action text NOT NULL,
      entity text NOT NULL,
      entity_id text,
      detail jsonb NOT NULL DEFAULT '{}'::jsonb,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX audit_log_shop_idx ON audit_log (shop_id, created_at DESC);
    -- the session store of connect-pg-simple
    CREATE TABLE "session" (
      sid varchar NOT NULL PRIMARY KEY,
      sess json NOT NULL,
      expire timestamp(6) NOT NULL
    );
    CREATE INDEX session_expire_idx ON "session" (expire);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP TABLE IF EXISTS "session", audit_log, coaching_notes, attachments, diagnosis_steps, diagnoses,
      review_comments, procedure_versions, procedures, meters, vehicles, password_resets, invitations,
      memberships, users, shops CASCADE;
  `);
}
