import type { QueryInterface } from 'sequelize';

// The step write is the hot path; this makes it cheaper for PostgreSQL without loosening anything.
// - A step's shop is its diagnosis's shop: one foreign key on (diagnosis_id, shop_id) says so and
//   replaces the two separate ones, so an insert checks one parent row, not also the shop row that
//   every concurrent step of the shop would lock.
// - Room on each diagnoses page (fillfactor 85) lets the per-step touch of last_activity_at and
//   updated_at, which are in no index, stay a HOT update instead of a new entry in nine indexes.
// - The writer passes the Debrief scope columns itself; the trigger fills them only for others.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE UNIQUE INDEX IF NOT EXISTS diagnoses_id_shop_key ON diagnoses (id, shop_id);
    ALTER TABLE diagnosis_steps
      DROP CONSTRAINT IF EXISTS diagnosis_steps_diagnosis_id_fkey,
      DROP CONSTRAINT IF EXISTS diagnosis_steps_shop_id_fkey,
      ADD CONSTRAINT diagnosis_steps_diagnosis_shop_fkey FOREIGN KEY (diagnosis_id, shop_id)
        REFERENCES diagnoses (id, shop_id) ON DELETE CASCADE;
    ALTER TABLE diagnoses SET (fillfactor = 85);
    DROP TRIGGER IF EXISTS diagnosis_steps_debrief_scope ON diagnosis_steps;
    CREATE TRIGGER diagnosis_steps_debrief_scope BEFORE INSERT ON diagnosis_steps
      FOR EACH ROW WHEN (NEW.dx_version_id IS NULL) EXECUTE FUNCTION diagnosis_steps_debrief_scope();
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP TRIGGER IF EXISTS diagnosis_steps_debrief_scope ON diagnosis_steps;
    CREATE TRIGGER diagnosis_steps_debrief_scope BEFORE INSERT ON diagnosis_steps
      FOR EACH ROW EXECUTE FUNCTION diagnosis_steps_debrief_scope();
    ALTER TABLE diagnoses RESET (fillfactor);
    ALTER TABLE diagnosis_steps
      DROP CONSTRAINT IF EXISTS diagnosis_steps_diagnosis_shop_fkey,
      ADD CONSTRAINT diagnosis_steps_diagnosis_id_fkey FOREIGN KEY (diagnosis_id) REFERENCES diagnoses (id) ON DELETE CASCADE,
      ADD CONSTRAINT diagnosis_steps_shop_id_fkey FOREIGN KEY (shop_id) REFERENCES shops (id) ON DELETE CASCADE;
    DROP INDEX IF EXISTS diagnoses_id_shop_key;
  `);
}
