import type { QueryInterface } from 'sequelize';

// "Continue in" steps. A published version keeps, in `links`, which version of each procedure it
// continues in (slug → version id, fixed at publish like the rest of the version), so every walk of
// it crosses into the same versions on the phone and on the server. A diagnosis pins, in
// diagnosis_linked_versions, every version besides its own that its walk may run.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE procedure_versions ADD COLUMN links jsonb NOT NULL DEFAULT '{}'::jsonb;
    CREATE TABLE diagnosis_linked_versions (
      diagnosis_id uuid NOT NULL REFERENCES diagnoses(id) ON DELETE CASCADE,
      procedure_version_id uuid NOT NULL REFERENCES procedure_versions(id),
      shop_id uuid NOT NULL REFERENCES shops(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (diagnosis_id, procedure_version_id)
    );
    CREATE INDEX diagnosis_linked_versions_version ON diagnosis_linked_versions (shop_id, procedure_version_id);`);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP TABLE diagnosis_linked_versions;
    ALTER TABLE procedure_versions DROP COLUMN links;`);
}
