import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import request from 'supertest';
import { startTestApp, signInAs, expectEnvelope, type TestEnv, type Client } from './harness';

let env: TestEnv;
let tech: Client;
beforeAll(async () => {
  env = await startTestApp();
  tech = await signInAs(env.app, 'tech');
});
afterAll(async () => { await env.close(); });

const tinyProcedure = {
  schemaVersion: 2,
  meta: { title: 'Plug check', symptom: 'No spark', ignitionSystem: 'magneto-cdi' },
  start: 'look',
  steps: [
    { id: 'look', kind: 'observation', title: 'Spark at the tester?', question: 'Is there a spark?', answers: [
      { id: 'yes', label: 'Yes', next: 'fine' }, { id: 'no', label: 'No', next: 'orphan_next' }] },
    { id: 'fine', kind: 'finding', title: 'Ignition fine', cause: 'Spark present', repair: 'Look at fuel' },
  ],
};

describe('the engine over HTTP', () => {
  it('POST /api/procedures/lint reports a dangling branch with its step', async () => {
    const res = await tech.post('/api/procedures/lint', { document: tinyProcedure }).expect(200);
    expect(res.body.ok).toBe(false);
    expect(res.body.findings).toEqual(expect.arrayContaining([expect.objectContaining({ severity: 'error', steps: expect.arrayContaining(['look']) })]));
  });

  it('POST /api/procedures/lint refuses a body that is not a procedure with field issues', async () => {
    const res = await tech.post('/api/procedures/lint', { document: { schemaVersion: 1 } });
    expect(res.status).toBe(400);
    expect(expectEnvelope(res.body).issues!.length).toBeGreaterThan(0);
  });

  it('POST /api/readings/parse understands an IEC 60062 code (4K7 = 4 700 Ω)', async () => {
    const res = await tech.post('/api/readings/parse', { text: '4K7', quantity: 'resistance' }).expect(200);
    expect(res.body).toMatchObject({ ok: true, value: 4700 });
    expect(res.body.display).toContain('4.7');
  });

  it('POST /api/readings/parse explains what it could not understand', async () => {
    const res = await tech.post('/api/readings/parse', { text: '4.7 banana', quantity: 'resistance' }).expect(200);
    expect(res.body.ok).toBe(false);
    expect(res.body.error.message.length).toBeGreaterThan(10);
  });

  it('both need a signed-in user', async () => {
    await request(env.app).post('/api/readings/parse').send({ text: '1', quantity: 'resistance' }).expect(403); // CSRF first
    const c = request.agent(env.app);
    const { body } = await c.get('/api/auth/csrf');
    await c.post('/api/readings/parse').set('X-CSRF-Token', body.token).send({ text: '1', quantity: 'resistance' }).expect(401);
  });
});
