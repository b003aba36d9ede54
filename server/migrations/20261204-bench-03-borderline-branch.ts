import type { QueryInterface } from 'sequelize';

// Until this fix the step write stored band_id NULL when a borderline reading took the author's
// borderline branch, so Debrief counted those answers under no branch. Such a row is told apart
// exactly: a Reading whose verdict is borderline and whose walk went on ('answered', not a
// re-measure) with no band can only have taken the borderline branch. Repairs those rows.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    UPDATE diagnosis_steps SET band_id = 'borderline'
     WHERE kind = 'reading' AND band_id IS NULL AND verdict IN ('borderline-low', 'borderline-high')
       AND shown->>'route' = 'answered' AND next_step_id IS NOT NULL`);
}

// The repaired rows are not told apart from rows stored right; nothing to undo.
export async function down(): Promise<void> {}
