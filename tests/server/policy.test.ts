import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { startTestApp, signInAs, type TestEnv, type Client } from './harness';
import { publishBenchProcedure, startBody, stepBody, type BenchWorld } from './bench-fixtures';

// One permission policy (server/auth/policy.ts over shared/schema/role-names.ts): the same
// question gets the same answer on every endpoint that asks it.

let env: TestEnv;
let world: BenchWorld;
let c: Record<'admin' | 'author' | 'lead' | 'tech' | 'trainer', Client>;
let techDiagnosis: string;

beforeAll(async () => {
  env = await startTestApp();
  world = await publishBenchProcedure();
  const [admin, author, lead, tech, trainer] = await Promise.all((['admin', 'author', 'lead', 'tech', 'trainer'] as const).map((w) => signInAs(env.app, w)));
  c = { admin: admin!, author: author!, lead: lead!, tech: tech!, trainer: trainer! };
  techDiagnosis = (await c.tech.post('/api/diagnoses', startBody(world)).expect(201)).body.id;
});
afterAll(async () => { await env.close(); });

describe('one answer per question', () => {
  it('each role gets the same answer for a technician\'s diagnosis on the Bench record and in Debrief', async () => {
    const expected = { admin: 403, author: 404, lead: 200, tech: 200, trainer: 200 } as const;
    for (const [who, status] of Object.entries(expected) as [keyof typeof c, number][]) {
      const bench = await c[who].get(`/api/diagnoses/${techDiagnosis}`);
      const debrief = await c[who].get(`/api/debrief/diagnoses/${techDiagnosis}`);
      expect([who, bench.status, debrief.status]).toEqual([who, status, status]);
    }
  });

  it('an admin with no diagnosis role is refused the Bench list as well as the Debrief table', async () => {
    expect((await c.admin.get('/api/diagnoses')).status).toBe(403);
    expect((await c.admin.get('/api/debrief/diagnoses')).status).toBe(403);
  });

  it('an author, who is offered the Bench, can start a diagnosis and record its first step', async () => {
    const start = await c.author.post('/api/diagnoses', startBody(world)).expect(201);
    const step = await c.author.post(`/api/diagnoses/${start.body.id}/steps`, stepBody('killLead', null));
    expect(step.status).toBe(201);
    // and sees it among their own, but not the technician's
    const mine = await c.author.get('/api/diagnoses').expect(200);
    expect(mine.body.map((d: { id: string }) => d.id)).toEqual([start.body.id]);
  });

  it('only a lead may record a step on a colleague\'s diagnosis; for the others it does not exist', async () => {
    expect((await c.author.post(`/api/diagnoses/${techDiagnosis}/steps`, stepBody('killLead', null))).status).toBe(404);
    expect((await c.lead.post(`/api/diagnoses/${techDiagnosis}/steps`, stepBody('killLead', null))).status).toBe(201);
    expect((await c.trainer.post(`/api/diagnoses/${techDiagnosis}/steps`, stepBody('killLead', null))).status).toBe(403);
  });
});
