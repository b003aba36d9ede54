import { QueryTypes } from 'sequelize';
import { CURRENT_SCHEMA_VERSION, procedureDocumentSchema, type ProcedureDocument, type ProcedureDocumentInput } from '@shared/schema';
import type { AppDeps } from '../../server/deps';

/**
 * A small "no spark" procedure for the Debrief tests (illustrative limits, not service data):
 * plug check, then a chain of four checks that each end at a Finding or pass on, then a task and
 * a substitution Finding; a spark at the tester hands off.
 */
export const FIXTURE_DOC: ProcedureDocumentInput = {
  schemaVersion: CURRENT_SCHEMA_VERSION,
  meta: { title: 'Debrief fixture: no spark', symptom: 'No spark', ignitionSystem: 'magneto-cdi', minutesPerStep: 2 },
  start: 'prepare',
  steps: [
    { id: 'prepare', kind: 'task', title: 'Fit a spark tester', next: 'sparkSeen' },
    { id: 'sparkSeen', kind: 'observation', title: 'Spark at the tester', question: 'Is there a spark?',
      answers: [{ id: 'yes', label: 'Yes', next: 'senior' }, { id: 'no', label: 'No', next: 'killSwitch' }] },
    { id: 'killSwitch', kind: 'observation', title: 'Kill switch lead', question: 'Does the spark return with the stop lead off?', minutes: 3,
      answers: [{ id: 'returns', label: 'Spark returns', next: 'killFault' }, { id: 'still', label: 'Still none', next: 'coilPrimary' }] },
    { id: 'coilPrimary', kind: 'reading', title: 'Coil primary resistance', quantity: 'resistance', unit: 'Ω', minutes: 4,
      limits: { kind: 'range', min: 0.2, max: 1.0 }, decision: 'guarded',
      meter: { percentOfReading: 1, counts: 2, resolution: 0.01 },
      bands: [
        { id: 'low', label: 'Below', upper: { value: 0.2, inclusive: false }, next: 'coilFault' },
        { id: 'ok', label: 'Within', lower: { value: 0.2, inclusive: true }, upper: { value: 1.0, inclusive: true }, next: 'exciter' },
        { id: 'high', label: 'Above', lower: { value: 1.0, inclusive: false }, next: 'coilFault' },
      ] },
    { id: 'exciter', kind: 'reading', title: 'Exciter coil peak voltage', quantity: 'peak-voltage', unit: 'V', minutes: 5,
      limits: { kind: 'range', min: 100, max: 400 },
      bands: [
        { id: 'low', label: 'Below', upper: { value: 100, inclusive: false }, next: 'exciterFault' },
        { id: 'ok', label: 'Within', lower: { value: 100, inclusive: true }, next: 'pulserGap' },
      ] },
    { id: 'pulserGap', kind: 'observation', title: 'Pulser air gap', question: 'Is the gap within the feeler?', minutes: 6,
      answers: [{ id: 'wide', label: 'Too wide', next: 'gapFault' }, { id: 'fine', label: 'Fine', next: 'substitute' }] },
    { id: 'substitute', kind: 'task', title: 'Fit a known-good CDI unit', next: 'cdiFault' },
    { id: 'killFault', kind: 'finding', title: 'Stop circuit shorted', cause: 'Stop lead chafed to chassis', repair: 'Repair the lead' },
    { id: 'coilFault', kind: 'finding', title: 'Ignition coil', cause: 'Primary winding out of limits', repair: 'Replace the coil' },
    { id: 'exciterFault', kind: 'finding', title: 'Exciter coil', cause: 'Low exciter output', repair: 'Replace the stator' },
    { id: 'gapFault', kind: 'finding', title: 'Pulser gap', cause: 'Gap too wide', repair: 'Set the gap' },
    { id: 'cdiFault', kind: 'finding', title: 'CDI unit', cause: 'CDI unit faulty', repair: 'Replace the CDI unit' },
    { id: 'senior', kind: 'handoff', title: 'Hand to a senior technician', reason: 'Spark present: look elsewhere' },
  ],
};

export const fixtureDoc = (): ProcedureDocument => procedureDocumentSchema.parse(FIXTURE_DOC);

/** Creates the fixture procedure with a published version 1 in the shop; returns their ids. */
export async function publishFixture(deps: Pick<AppDeps, 'sequelize'>, shopId: string, slug = 'debrief-fixture'): Promise<{ procedureId: string; versionId: string }> {
  const [p] = await deps.sequelize.query<{ id: string }>(
    `INSERT INTO procedures (shop_id, slug, title, symptom, ignition_system) VALUES ($1, $2, 'Debrief fixture: no spark', 'No spark', 'magneto-cdi') RETURNING id`,
    { bind: [shopId, slug], type: QueryTypes.SELECT },
  );
  const [v] = await deps.sequelize.query<{ id: string }>(
    `INSERT INTO procedure_versions (shop_id, procedure_id, number, status, document, published_at) VALUES ($1, $2, 1, 'published', $3::jsonb, now()) RETURNING id`,
    { bind: [shopId, p!.id, JSON.stringify(fixtureDoc())], type: QueryTypes.SELECT },
  );
  return { procedureId: p!.id, versionId: v!.id };
}
