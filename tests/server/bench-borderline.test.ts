import { randomUUID } from 'node:crypto';
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { QueryTypes } from 'sequelize';
import { startTestApp, signInAs, type TestEnv, type Client } from './harness';
import { stepBody } from './bench-fixtures';
import { up as repairBorderline } from '../../server/migrations/20261204-bench-03-borderline-branch';

// A borderline reading on a step whose author chose "branch" is recorded as the borderline branch,
// through the real step endpoint, and Debrief counts it there. The demo "Weak or intermittent
// spark" sends a borderline plug cap to its replacement; its limits (4 to 6 kΩ, guarded decision,
// the demo kΩ meter) are invented for the demo.

let env: TestEnv;
let tech: Client;
let trainer: Client;

beforeAll(async () => {
  env = await startTestApp();
  [tech, trainer] = await Promise.all([signInAs(env.app, 'tech'), signInAs(env.app, 'trainer')]);
});
afterAll(async () => { await env.close(); });

async function walkToCap(cap: string) {
  const version = (await tech.get('/api/bench/procedures/weak-spark').expect(200)).body as { id: string; procedureId: string };
  const vehicles = (await tech.get('/api/vehicles').expect(200)).body as { id: string }[];
  const id = randomUUID();
  await tech.post('/api/diagnoses', {
    id, procedureVersionId: version.id, vehicleId: vehicles[0]!.id, complaint: 'Weak orange spark',
    conditions: { engine: 'cold', ambientC: 18, startingMethod: 'kick', batteryVolts: null }, startedAt: new Date().toISOString(),
  }).expect(201);
  const answers = [
    stepBody('prepare', null), stepBody('plugInspect', null, { answerId: 'ok' }), stepBody('plugGap', null, { entered: '0.7 mm' }),
    stepBody('capOhms', null, { entered: cap }),
  ];
  let after: string | null = null;
  const results: { bandId: string | null; verdict: string | null; next: string | null }[] = [];
  for (const a of answers) {
    const res = await tech.post(`/api/diagnoses/${id}/steps`, { ...a, after }).expect(201);
    results.push(res.body);
    after = a.id;
  }
  return { id, version, cap: results[results.length - 1]! };
}

describe('the borderline branch', () => {
  it('a plug cap of 6.05 kΩ is borderline, goes to the replacement and is stored and counted as the borderline branch', async () => {
    const { id, version, cap } = await walkToCap('6.05 kΩ');
    expect(cap).toMatchObject({ verdict: 'borderline-high', next: 'capReplace', bandId: 'borderline' });
    const [row] = await env.runtime.deps.sequelize.query<{ band_id: string | null }>(
      `SELECT band_id FROM diagnosis_steps WHERE diagnosis_id = $1 AND step_id = 'capOhms'`, { bind: [id], type: QueryTypes.SELECT });
    expect(row!.band_id).toBe('borderline');
    const steps = (await trainer.get(`/api/debrief/analytics/steps?procedureId=${version.procedureId}`).expect(200)).body as { branches: { from: string; handle: string; count: number }[] };
    const fromCap = steps.branches.filter((b) => b.from === 'capOhms');
    expect(fromCap).toEqual([expect.objectContaining({ handle: 'borderline', count: 1 })]);
    // and the replay names it so
    const replay = (await trainer.get(`/api/debrief/diagnoses/${id}`).expect(200)).body as { steps: { stepId: string; bandId: string | null }[] };
    expect(replay.steps.find((s) => s.stepId === 'capOhms')?.bandId).toBe('borderline');
  });

  it('a plug cap well inside its limits takes the band of the within-limits branch', async () => {
    const { cap } = await walkToCap('5.0 kΩ');
    expect(cap).toMatchObject({ verdict: 'within', next: 'htLead', bandId: 'within' });
  });

  it('the migration gives a borderline branch stored before the fix its branch back, and leaves re-measures and bands alone', async () => {
    const { id } = await walkToCap('6.05 kΩ');
    const { sequelize } = env.runtime.deps;
    const capRow = async () => (await sequelize.query<{ band_id: string | null }>(
      `SELECT band_id FROM diagnosis_steps WHERE diagnosis_id = $1 AND step_id = 'capOhms'`, { bind: [id], type: QueryTypes.SELECT }))[0]!.band_id;
    await sequelize.query(`UPDATE diagnosis_steps SET band_id = NULL WHERE diagnosis_id = $1 AND step_id = 'capOhms'`, { bind: [id] });
    const [before] = await sequelize.query<{ n: number }>(`SELECT count(*)::int AS n FROM diagnosis_steps WHERE band_id IS NOT NULL`, { type: QueryTypes.SELECT });
    await repairBorderline({ context: sequelize.getQueryInterface() });
    expect(await capRow()).toBe('borderline');
    const [after] = await sequelize.query<{ n: number }>(`SELECT count(*)::int AS n FROM diagnosis_steps WHERE band_id IS NOT NULL`, { type: QueryTypes.SELECT });
    expect(after!.n).toBe(before!.n + 1);
  });
});
