import type { QueryInterface } from 'sequelize';

// Bench: each answered step remembers where it routes (next_step_id), so the server can check the
// following step against the pinned version without re-deciding the whole path; and seq is unique
// per diagnosis so that two racing requests can never store the same position twice.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE diagnosis_steps ADD COLUMN IF NOT EXISTS next_step_id text;
    DROP INDEX IF EXISTS diagnosis_steps_diagnosis_idx;
    CREATE UNIQUE INDEX IF NOT EXISTS diagnosis_steps_diagnosis_seq_key ON diagnosis_steps (diagnosis_id, seq);
    CREATE INDEX IF NOT EXISTS diagnoses_technician_status_idx ON diagnoses (shop_id, technician_id, status);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP INDEX IF EXISTS diagnoses_technician_status_idx;
    DROP INDEX IF EXISTS diagnosis_steps_diagnosis_seq_key;
    CREATE INDEX IF NOT EXISTS diagnosis_steps_diagnosis_idx ON diagnosis_steps (diagnosis_id, seq);
    ALTER TABLE diagnosis_steps DROP COLUMN IF EXISTS next_step_id;
  `);
}
