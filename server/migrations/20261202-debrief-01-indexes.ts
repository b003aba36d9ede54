import type { QueryInterface } from 'sequelize';

// Debrief reads aggregate over a shop's diagnoses of one procedure (or version) and date range,
// then over their steps. The covering indexes let PostgreSQL answer from the index alone, and the
// two small partial indexes make the table's "borderline on the way" and "taken back" flags cheap.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE INDEX IF NOT EXISTS diagnoses_debrief_version_idx ON diagnoses (shop_id, procedure_version_id, started_at)
      INCLUDE (id, status, ending_step_id, ended_at, technician_id, vehicle_id);
    CREATE INDEX IF NOT EXISTS diagnoses_debrief_started_idx ON diagnoses (shop_id, started_at DESC);
    CREATE INDEX IF NOT EXISTS diagnoses_debrief_vehicle_idx ON diagnoses (shop_id, vehicle_id, started_at);
    CREATE INDEX IF NOT EXISTS diagnosis_steps_debrief_idx ON diagnosis_steps (diagnosis_id)
      INCLUDE (step_id, kind, superseded, band_id, answer_id, value, verdict, started_at, answered_at);
    CREATE INDEX IF NOT EXISTS diagnosis_steps_borderline_idx ON diagnosis_steps (diagnosis_id)
      WHERE verdict IN ('borderline-low', 'borderline-high');
    CREATE INDEX IF NOT EXISTS diagnosis_steps_superseded_idx ON diagnosis_steps (diagnosis_id) WHERE superseded;
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP INDEX IF EXISTS diagnosis_steps_superseded_idx;
    DROP INDEX IF EXISTS diagnosis_steps_borderline_idx;
    DROP INDEX IF EXISTS diagnosis_steps_debrief_idx;
    DROP INDEX IF EXISTS diagnoses_debrief_vehicle_idx;
    DROP INDEX IF EXISTS diagnoses_debrief_started_idx;
    DROP INDEX IF EXISTS diagnoses_debrief_version_idx;
  `);
}
