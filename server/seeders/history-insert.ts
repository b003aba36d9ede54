import type { AppDeps } from '../deps';

/** One multi-row INSERT per table per batch (unnest of column arrays), in one transaction. */
export async function insertRows(deps: Pick<AppDeps, 'sequelize'>, shopId: string, diagnoses: unknown[][], steps: unknown[][]): Promise<void> {
  const col = (rows: unknown[][], i: number) => rows.map((r) => r[i]);
  await deps.sequelize.transaction(async (transaction) => {
    await deps.sequelize.query(
      `INSERT INTO diagnoses (id, shop_id, procedure_version_id, vehicle_id, technician_id, status, ending_step_id, outcome,
         started_at, ended_at, last_activity_at, complaint, conditions)
       SELECT id, $1, v, veh, tech, st, ending, outcome::jsonb, started, ended, last, 'Will not start', '{"engine":"cold","ambientC":18,"startingMethod":"kick"}'::jsonb
       FROM unnest($2::uuid[], $3::uuid[], $4::uuid[], $5::uuid[], $6::text[], $7::text[], $8::text[], $9::timestamptz[], $10::timestamptz[], $11::timestamptz[])
         AS t(id, v, veh, tech, st, ending, outcome, started, ended, last)`,
      { bind: [shopId, ...Array.from({ length: 10 }, (_, i) => col(diagnoses, i))], transaction },
    );
    for (let i = 0; i < steps.length; i += 20_000) {
      const chunk = steps.slice(i, i + 20_000);
      await deps.sequelize.query(
        `INSERT INTO diagnosis_steps (id, shop_id, diagnosis_id, seq, step_id, kind, shown, entered, value, unit, verdict, band_id,
           answer_id, next_step_id, superseded, started_at, answered_at, payload_hash)
         SELECT id, $1, d, seq, step, kind, shown::jsonb, entered, value, unit, verdict, band, answer, next, sup, started, answered, hash
         FROM unnest($2::uuid[], $3::uuid[], $4::int[], $5::text[], $6::text[], $7::text[], $8::text[], $9::float8[], $10::text[],
           $11::text[], $12::text[], $13::text[], $14::text[], $15::bool[], $16::timestamptz[], $17::timestamptz[], $18::text[])
           AS t(id, d, seq, step, kind, shown, entered, value, unit, verdict, band, answer, next, sup, started, answered, hash)`,
        { bind: [shopId, ...Array.from({ length: 17 }, (_, k) => col(chunk, k))], transaction },
      );
    }
  });
}
