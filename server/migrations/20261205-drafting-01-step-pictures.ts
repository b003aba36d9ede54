import type { QueryInterface } from 'sequelize';

// Reference pictures on procedure steps. A row is one stored picture (the original as uploaded,
// a thumbnail and a phone-sized rendition, all in object storage) of one shop; a version's
// document names the pictures it shows, in order, with their captions. Rows never change after
// upload, so a published version's pictures are as immutable as its document; a new draft copies
// the references. `version_id` is the draft the picture was uploaded into.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE IF NOT EXISTS step_pictures (
      id uuid PRIMARY KEY,
      shop_id uuid NOT NULL REFERENCES shops(id) ON DELETE CASCADE,
      procedure_id uuid NOT NULL REFERENCES procedures(id) ON DELETE CASCADE,
      version_id uuid REFERENCES procedure_versions(id) ON DELETE SET NULL,
      step_id text NOT NULL,
      object_key text NOT NULL,
      thumb_key text NOT NULL,
      phone_key text NOT NULL,
      content_type text NOT NULL,
      byte_size integer NOT NULL,
      phone_bytes integer NOT NULL,
      width integer NOT NULL,
      height integer NOT NULL,
      sha256 text NOT NULL,
      original_name text NOT NULL DEFAULT '',
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX IF NOT EXISTS step_pictures_procedure_idx ON step_pictures (shop_id, procedure_id);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('DROP TABLE IF EXISTS step_pictures');
}
