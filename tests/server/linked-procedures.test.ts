import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { randomUUID } from 'node:crypto';
import { startTestApp, signInAs, type TestEnv, type Client } from './harness';
import { startBody, stepBody, type BenchWorld } from './bench-fixtures';
import { doc, finding } from '../shared/fixtures';
import { Meter, Procedure, ProcedureVersion, Shop, Vehicle } from '../../server/models';
import type { ProcedureDocument, StepInput } from '@shared/schema';

let env: TestEnv;
let tech: Client;
let author: Client;
let lead: Client;

beforeAll(async () => {
  env = await startTestApp();
  [tech, author, lead] = await Promise.all([signInAs(env.app, 'tech'), signInAs(env.app, 'author'), signInAs(env.app, 'lead')]);
});
afterAll(async () => env?.close());

async function demoWorld(slug: string): Promise<BenchWorld & { procedureId: string }> {
  const shop = (await Shop.findOne({ where: { slug: 'larkspur-lane' } }))!;
  const proc = (await Procedure.findOne({ where: { shopId: shop.id, slug } }))!;
  const version = (await ProcedureVersion.findOne({ where: { procedureId: proc.id, status: 'published' } }))!;
  const vehicle = (await Vehicle.findOne({ where: { shopId: shop.id, label: 'W-01' } }))!;
  const meter = (await Meter.findOne({ where: { shopId: shop.id, name: 'Bench meter 1' } }))!;
  return { versionId: version.id, vehicleId: vehicle.id, meterId: meter.id, shopId: shop.id, procedureId: proc.id };
}

async function step(id: string, stepId: string, after: string | null, extra: Record<string, unknown> = {}) {
  const res = await tech.post(`/api/diagnoses/${id}/steps`, stepBody(stepId, after, extra));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: string; next: string | null; status: string };
}

describe('a diagnosis that continues in another procedure', () => {
  it('pins both versions at start, crosses from No spark into Weak or intermittent spark and ends in one record', async () => {
    const noSpark = await demoWorld('no-spark');
    const weakSpark = await demoWorld('weak-spark');
    const body = startBody(noSpark);
    await tech.post('/api/diagnoses', body).expect(201);
    const pins = await env.runtime.deps.sequelize.query<{ procedure_version_id: string }>(
      'SELECT procedure_version_id FROM diagnosis_linked_versions WHERE diagnosis_id = :id', { replacements: { id: body.id }, type: QueryTypes.SELECT });
    expect(pins.map((p) => p.procedure_version_id)).toEqual([weakSpark.versionId]);

    const a = await step(body.id, 'prepare', null);
    const b = await step(body.id, 'sparkTest', a.id, { answerId: 'weak', acknowledged: true });
    expect(b.next).toBe('useWeakSpark');
    const hop = await step(body.id, 'useWeakSpark', b.id);
    expect(hop.next).toBe('k1_prepare');
    const c = await step(body.id, 'k1_prepare', hop.id);
    const d = await step(body.id, 'k1_plugInspect', c.id, { answerId: 'fouled' });
    const end = await step(body.id, d.next!, d.id, { outcome: { partsFitted: [], finalCheck: { spark: true, runs: true, stops: true }, labourMinutes: 10 } });
    expect(end.status).toBe('finished');

    const rec = await tech.get(`/api/diagnoses/${body.id}`).expect(200);
    const steps = rec.body.steps as { stepId: string; kind: string; shown: { title: string; procedure?: string } }[];
    expect(steps.map((s) => s.stepId)).toEqual(['prepare', 'sparkTest', 'useWeakSpark', 'k1_prepare', 'k1_plugInspect', 'k1_plugReplace']);
    expect(steps[2]).toMatchObject({ kind: 'link', shown: { procedure: 'weak-spark' } });
    expect(steps[5]!.shown.title).toBe('Spark plug worn or fouled');
    // One record: the weak-spark procedure has no diagnosis of its own.
    const counts = await env.runtime.deps.sequelize.query<{ n: string }>(
      'SELECT count(*) AS n FROM diagnoses WHERE procedure_version_id = :v', { replacements: { v: weakSpark.versionId }, type: QueryTypes.SELECT });
    expect(Number(counts[0]!.n)).toBe(0);
  });

  it('the phone receives No spark joined with the pinned Weak or intermittent spark, so the link works without signal', async () => {
    const v = await tech.get('/api/bench/procedures/no-spark').expect(200);
    const doc = v.body.document as ProcedureDocument;
    const link = doc.steps.find((s) => s.id === 'useWeakSpark');
    expect(link).toMatchObject({ kind: 'link', procedure: 'weak-spark', next: 'k1_prepare' });
    expect(doc.steps.some((s) => s.id === 'k1_storedEnergy' && s.kind === 'formula' && s.expression.includes('k1_exciterPeak'))).toBe(true);
  });
});

const META = { symptom: 'No spark at the plug', ignitionSystem: 'magneto-cdi' as const };

/** A one-step procedure that continues in `target` (a slug). */
function linking(title: string, target: string): ProcedureDocument {
  const d = doc([{ id: 'go', kind: 'link', title: 'Continue', procedure: target } as StepInput, finding('unused')]);
  return { ...d, meta: { ...d.meta, ...META, title }, steps: d.steps.filter((s) => s.id === 'go') };
}

async function draft(title: string, document?: (slug: string) => ProcedureDocument) {
  const res = await author.post('/api/procedures', { meta: { ...META, title } }).expect(201);
  const ids = res.body as { procedureId: string; draftId: string };
  const slug = (await Procedure.findByPk(ids.procedureId))!.slug;
  const url = `/api/procedures/${ids.procedureId}/versions/${ids.draftId}`;
  if (document) {
    const got = await author.get(url).expect(200);
    await author.put(url, { document: document(slug), lockVersion: got.body.lockVersion }).expect(200);
  }
  return { ...ids, slug, url };
}

async function codesOnPublish(url: string): Promise<string[]> {
  const saved = await author.get(url).expect(200);
  await author.post(`${url}/submit`).expect(200);
  const res = await lead.post(`${url}/publish`);
  expect(res.status, JSON.stringify(res.body)).toBe(422);
  return (saved.body.lintReport as { code: string }[]).map((f) => f.code);
}

describe('the soundness check knows links', () => {
  it('flags a link to a procedure the shop does not have, and publish refuses it', async () => {
    const d = await draft('Links nowhere', () => linking('Links nowhere', `gone-${randomUUID().slice(0, 8)}`));
    expect(await codesOnPublish(d.url)).toContain('link-target-missing');
  });

  it('flags a link to a procedure with no published version, and publish refuses it', async () => {
    const target = await draft('Never published');
    const d = await draft('Links to a draft', () => linking('Links to a draft', target.slug));
    expect(await codesOnPublish(d.url)).toContain('link-target-unpublished');
  });

  it('flags a chain of links that comes back to the procedure itself', async () => {
    const d = await draft('Links to itself', (slug) => linking('Links to itself', slug));
    expect(await codesOnPublish(d.url)).toContain('link-cycle');
  });
});
