import type { QueryInterface } from 'sequelize';

// Debrief aggregates steps by their diagnosis's procedure version and start date. Copying those
// two (and the technician), which never change after a diagnosis starts, onto each step row lets
// one covering index answer every per-step figure without joining a million steps to their
// diagnoses. A trigger fills them on insert, so writers need not know about them.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE diagnosis_steps
      ADD COLUMN IF NOT EXISTS dx_version_id uuid,
      ADD COLUMN IF NOT EXISTS dx_started_at timestamptz,
      ADD COLUMN IF NOT EXISTS dx_technician_id uuid;
    CREATE OR REPLACE FUNCTION diagnosis_steps_debrief_scope() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      SELECT d.procedure_version_id, d.started_at, d.technician_id
        INTO NEW.dx_version_id, NEW.dx_started_at, NEW.dx_technician_id
        FROM diagnoses d WHERE d.id = NEW.diagnosis_id;
      RETURN NEW;
    END $$;
    DROP TRIGGER IF EXISTS diagnosis_steps_debrief_scope ON diagnosis_steps;
    CREATE TRIGGER diagnosis_steps_debrief_scope BEFORE INSERT ON diagnosis_steps
      FOR EACH ROW EXECUTE FUNCTION diagnosis_steps_debrief_scope();
    UPDATE diagnosis_steps s SET dx_version_id = d.procedure_version_id, dx_started_at = d.started_at, dx_technician_id = d.technician_id
      FROM diagnoses d WHERE d.id = s.diagnosis_id AND s.dx_version_id IS NULL;
    DROP INDEX IF EXISTS diagnosis_steps_debrief_idx;
    CREATE INDEX IF NOT EXISTS diagnosis_steps_debrief_scope_idx ON diagnosis_steps (shop_id, dx_version_id, dx_started_at)
      INCLUDE (diagnosis_id, step_id, kind, superseded, band_id, answer_id, value, verdict, started_at, answered_at, dx_technician_id);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP INDEX IF EXISTS diagnosis_steps_debrief_scope_idx;
    DROP TRIGGER IF EXISTS diagnosis_steps_debrief_scope ON diagnosis_steps;
    DROP FUNCTION IF EXISTS diagnosis_steps_debrief_scope();
    ALTER TABLE diagnosis_steps DROP COLUMN IF EXISTS dx_version_id, DROP COLUMN IF EXISTS dx_started_at, DROP COLUMN IF EXISTS dx_technician_id;
    CREATE INDEX IF NOT EXISTS diagnosis_steps_debrief_idx ON diagnosis_steps (diagnosis_id)
      INCLUDE (step_id, kind, superseded, band_id, answer_id, value, verdict, started_at, answered_at);
  `);
}
