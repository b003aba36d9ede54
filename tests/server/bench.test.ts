import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import pg from 'pg';
import { randomUUID } from 'node:crypto';
import { startTestApp, signInAs, otherShopMember, expectEnvelope, type TestEnv, type Client } from './harness';
import { benchDoc, publishBenchProcedure, startBody, stepBody, type BenchWorld } from './bench-fixtures';
import { CoachingNote, Diagnosis, DiagnosisStep, User } from '../../server/models';
import { markAbandoned } from '../../server/services/housekeeping';

const originalQuery = pg.Client.prototype.query;
let env: TestEnv;
let tech: Client;
let world: BenchWorld;

beforeAll(async () => {
  env = await startTestApp();
  world = await publishBenchProcedure();
  tech = await signInAs(env.app, 'tech');
});
afterAll(async () => env?.close());

async function start(client = tech): Promise<string> {
  const body = startBody(world);
  const res = await client.post('/api/diagnoses', body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return body.id;
}

/** Sends a step and expects it stored; returns its id for the next `after`. */
async function step(id: string, stepId: string, after: string | null, extra: Record<string, unknown> = {}) {
  const res = await tech.post(`/api/diagnoses/${id}/steps`, stepBody(stepId, after, extra));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: string; next: string | null; verdict: string | null; value: number | null; status: string; seq: number };
}

describe('starting a diagnosis', () => {
  it('lists the published procedure filtered by symptom and ignition system', async () => {
    const all = await tech.get('/api/bench/procedures?symptom=spark&ignitionSystem=magneto-cdi').expect(200);
    expect(all.body.map((p: { slug: string }) => p.slug)).toContain('bench-test');
    const none = await tech.get('/api/bench/procedures?ignitionSystem=battery-inductive').expect(200);
    expect(none.body.map((p: { slug: string }) => p.slug)).not.toContain('bench-test');
    const v = await tech.get('/api/bench/procedures/bench-test').expect(200);
    expect(v.body.document.start).toBe('killLead');
  });

  it('starts once when the phone sends the same start twice', async () => {
    const body = startBody(world);
    await tech.post('/api/diagnoses', body).expect(201);
    await tech.post('/api/diagnoses', body).expect(200);
    expect(await Diagnosis.count({ where: { id: body.id } })).toBe(1);
    const mine = await tech.get('/api/diagnoses?status=active').expect(200);
    expect(mine.body.map((d: { id: string }) => d.id)).toContain(body.id);
  });

  it('refuses a machine of another shop as not found', async () => {
    const res = await tech.post('/api/diagnoses', { ...startBody(world), vehicleId: randomUUID() });
    expect(res.status).toBe(404);
    expectEnvelope(res.body);
  });
});

describe('stepping through the pinned version', () => {
  it('walks to a finding with readings decided on the server and keeps the complete record', async () => {
    const id = await start();
    const a = await step(id, 'killLead', null);
    expect(a.next).toBe('sparkTest');
    const b = await step(id, 'sparkTest', a.id, { answerId: 'none' });
    // 0,15k with a decimal comma is 150 Ω: within 100–200 Ω (limits invented for the test).
    const c = await step(id, 'exciter', b.id, { entered: '0,15k' });
    expect(c).toMatchObject({ value: 150, verdict: 'within', next: 'pulser' });
    // 120 Ω with 0.4 Ω test leads nulled is 119.6 Ω.
    const d = await step(id, 'pulser', c.id, { entered: '120', leadEntered: '0.4', acknowledged: true });
    expect(d.value).toBeCloseTo(119.6, 6);
    const e = await step(id, 'combined', d.id);
    // parallel(150, 119.6) = 150·119.6 / 269.6
    expect(e.value).toBeCloseTo((150 * 119.6) / 269.6, 6);
    const f = await step(id, 'cdiFinding', e.id, {
      outcome: { partsFitted: [{ name: 'CDI unit', lot: 'L2611' }], finalCheck: { spark: true, runs: true, stops: true }, labourMinutes: 35 },
    });
    expect(f.status).toBe('finished');
    const rec = await tech.get(`/api/diagnoses/${id}`).expect(200);
    expect(rec.body.status).toBe('finished');
    expect(rec.body.endingStepId).toBe('cdiFinding');
    expect(rec.body.outcome.partsFitted[0]).toEqual({ name: 'CDI unit', lot: 'L2611' });
    expect(rec.body.steps.map((s: { stepId: string }) => s.stepId)).toEqual(['killLead', 'sparkTest', 'exciter', 'pulser', 'combined', 'cdiFinding']);
    expect(rec.body.steps[2]).toMatchObject({ entered: '0,15k', unit: 'Ω', verdict: 'within', superseded: false });
    expect(rec.body.steps[2].shown.limitsText).toMatch(/100.*200/);
    const late = await tech.post(`/api/diagnoses/${id}/steps`, stepBody('killLead', null));
    expect(late.status).toBe(409);
  });

  it("the version a phone fetches carries the shop's recorded branch counts of ended diagnoses, for the progress line", async () => {
    const before = (await tech.get(`/api/bench/versions/${world.versionId}`).expect(200)).body as { branchCounts: Record<string, Record<string, number>> };
    const id = await start();
    const a = await step(id, 'killLead', null);
    const b = await step(id, 'sparkTest', a.id, { answerId: 'none' });
    const c = await step(id, 'exciter', b.id, { entered: '150' });
    const d = await step(id, 'pulser', c.id, { entered: '120', acknowledged: true });
    const e = await step(id, 'combined', d.id);
    // Still active: not counted yet.
    const during = (await tech.get(`/api/bench/versions/${world.versionId}`).expect(200)).body as typeof before;
    expect(during.branchCounts).toEqual(before.branchCounts);
    await step(id, 'cdiFinding', e.id, { outcome: { partsFitted: [], finalCheck: { spark: true, runs: true, stops: true }, labourMinutes: 30 } });
    const after = (await tech.get('/api/bench/procedures/bench-test').expect(200)).body as typeof before;
    expect(after.branchCounts.sparkTest?.['answer:none']).toBe((before.branchCounts.sparkTest?.['answer:none'] ?? 0) + 1);
    expect(after.branchCounts.exciter?.['band:ok']).toBeGreaterThan(0);
  });

  it('the list of diagnoses in progress names the technician and the step waiting, so two on the same machine differ', async () => {
    const fresh = await start();
    const moved = await start();
    await step(moved, 'killLead', null);
    const list = (await tech.get('/api/diagnoses?status=active&mine=1').expect(200)).body as { id: string; technicianName: string; currentStepTitle: string | null; lastActivityAt: string }[];
    const title = (stepId: string) => benchDoc.steps.find((s) => s.id === stepId)!.title;
    expect(list.find((d) => d.id === fresh)).toMatchObject({ technicianName: expect.stringMatching(/\S/), currentStepTitle: title('killLead') });
    expect(list.find((d) => d.id === moved)).toMatchObject({ currentStepTitle: title('sparkTest') });
    // the start page's machine list says when each machine was last diagnosed
    const vehicles = (await tech.get('/api/vehicles').expect(200)).body as { id: string; lastDiagnosedAt: string | null }[];
    expect(vehicles.find((v) => v.id === world.vehicleId)?.lastDiagnosedAt).toEqual(expect.any(String));
  });

  it('stores a step sent twice as one row, and refuses the same id with another payload', async () => {
    const id = await start();
    const body = stepBody('killLead', null);
    await tech.post(`/api/diagnoses/${id}/steps`, body).expect(201);
    const again = await tech.post(`/api/diagnoses/${id}/steps`, body).expect(200);
    expect(again.body.duplicate).toBe(true);
    expect(await DiagnosisStep.count({ where: { diagnosisId: id } })).toBe(1);
    // the path still stands at the step sent twice: the next answer follows it
    const next = await tech.post(`/api/diagnoses/${id}/steps`, stepBody('sparkTest', body.id, { answerId: 'none' }));
    expect(next.status).toBe(201);
    expect(await DiagnosisStep.count({ where: { diagnosisId: id, superseded: true } })).toBe(0);
    const changed = await tech.post(`/api/diagnoses/${id}/steps`, { ...body, note: 'different' });
    expect(changed.status).toBe(422);
    expect(expectEnvelope(changed.body).code).toBe('id_reused');
  });

  it('refuses a step that is not in the pinned version, and a branch the version does not allow', async () => {
    const id = await start();
    const unknown = await tech.post(`/api/diagnoses/${id}/steps`, stepBody('inventedStep', null));
    expect(unknown.status).toBe(422);
    expect(expectEnvelope(unknown.body).message).toMatch(/not part of version 1/);
    const a = await step(id, 'killLead', null);
    const skip = await tech.post(`/api/diagnoses/${id}/steps`, stepBody('exciter', a.id, { entered: '150' }));
    expect(skip.status).toBe(422);
    expect(expectEnvelope(skip.body).code).toBe('branch_not_allowed');
    const badAnswer = await tech.post(`/api/diagnoses/${id}/steps`, stepBody('sparkTest', a.id, { answerId: 'purple' }));
    expect(badAnswer.status).toBe(400);
    const badReading = await step(id, 'sparkTest', a.id, { answerId: 'none' });
    const unreadable = await tech.post(`/api/diagnoses/${id}/steps`, stepBody('exciter', badReading.id, { entered: '1,200' }));
    expect(unreadable.status).toBe(400);
    expect(expectEnvelope(unreadable.body).message).toMatch(/1\.2|1200/);
    expect(await DiagnosisStep.count({ where: { diagnosisId: id } })).toBe(2);
  });

  it('going back to change an answer keeps the old rows, marked superseded', async () => {
    const id = await start();
    const a = await step(id, 'killLead', null);
    const b = await step(id, 'sparkTest', a.id, { answerId: 'none' });
    await step(id, 'exciter', b.id, { entered: '4K7' }); // 4.7 kΩ: above the limits
    const redo = await step(id, 'sparkTest', a.id, { answerId: 'strong' });
    expect(redo.next).toBe('plugFinding');
    const rec = await tech.get(`/api/diagnoses/${id}`).expect(200);
    const rows = rec.body.steps as { stepId: string; superseded: boolean; seq: number; verdict: string | null }[];
    expect(rows.map((r) => [r.seq, r.stepId, r.superseded])).toEqual([
      [1, 'killLead', false], [2, 'sparkTest', true], [3, 'exciter', true], [4, 'sparkTest', false],
    ]);
    expect(rows[2]!.verdict).toBe('above');
  });

  /** Every statement any part of the app sends while fn runs (they all go through pg.Client#query). */
  async function statementsDuring(fn: () => Promise<unknown>): Promise<string[]> {
    const sql: string[] = [];
    const spy = vi.spyOn(pg.Client.prototype, 'query').mockImplementation(function (this: pg.Client, ...args: unknown[]) {
      const q = args[0] as string | { text: string };
      sql.push(typeof q === 'string' ? q : q.text);
      return originalQuery.apply(this, args as never) as never;
    });
    try {
      await fn();
      await new Promise((r) => setTimeout(r, 200)); // anything the session store might do after the response
    } finally {
      spy.mockRestore();
    }
    return sql;
  }

  it('records a step of a diagnosis being stepped with one statement, the atomic write', async () => {
    const id = await start();
    const a = await step(id, 'killLead', null);
    const b = await step(id, 'sparkTest', a.id, { answerId: 'none' });
    // session, membership and the diagnosis' head are remembered from the steps before
    const sql = await statementsDuring(() => step(id, 'exciter', b.id, { entered: '150' }));
    expect(sql, sql.join('\n---\n')).toHaveLength(1);
    expect(sql[0]).toMatch(/INSERT INTO diagnosis_steps/);
  });

  it('a step another app server recorded meanwhile costs one fresh read here, and the answer still lands in order', async () => {
    const id = await start();
    const a = await step(id, 'killLead', null);
    // What another server's write looks like from here: the next row appeared without this process.
    await env.runtime.deps.sequelize.query(
      `INSERT INTO diagnosis_steps (id, shop_id, diagnosis_id, seq, step_id, kind, shown, note, started_at, answered_at, payload_hash, answer_id, next_step_id)
       SELECT gen_random_uuid(), shop_id, diagnosis_id, 2, 'sparkTest', 'observation', shown, '', now(), now(), 'elsewhere', 'strong', 'plugFinding'
         FROM diagnosis_steps WHERE id = :a`, { replacements: { a: a.id } });
    let b: Awaited<ReturnType<typeof step>> | undefined;
    const sql = await statementsDuring(async () => { b = await step(id, 'sparkTest', a.id, { answerId: 'none' }); });
    expect(sql.filter((s) => /INSERT INTO diagnosis_steps/.test(s)), sql.join('\n---\n')).toHaveLength(2); // a seq conflict, then stored
    expect(sql.filter((s) => /FROM diagnoses d LEFT JOIN meters/.test(s))).toHaveLength(1);
    expect(b!.seq).toBe(3);
    // this answer follows killLead, so the other server's sparkTest answer is superseded by it
    const rows = await DiagnosisStep.findAll({ where: { diagnosisId: id }, order: [['seq', 'ASC']] });
    expect(rows.map((r) => [r.seq, r.stepId, r.answerId, r.superseded])).toEqual([
      [1, 'killLead', null, false], [2, 'sparkTest', 'strong', true], [3, 'sparkTest', 'none', false],
    ]);
  });

  it('a step updates the diagnosis itself only when its last activity is a minute old, or when it ends it', async () => {
    const id = await start();
    const a = await step(id, 'killLead', null);
    const touched = async () => (await Diagnosis.findByPk(id))!.lastActivityAt.getTime();
    const first = await touched();
    const b = await step(id, 'sparkTest', a.id, { answerId: 'none' });
    expect(await touched()).toBe(first);
    await env.runtime.deps.sequelize.query(`UPDATE diagnoses SET last_activity_at = now() - interval '2 minutes' WHERE id = :id`, { replacements: { id } });
    const stale = await touched();
    await step(id, 'exciter', b.id, { entered: '150' });
    expect(await touched()).toBeGreaterThan(stale + 60_000);
  });

  it('a diagnosis the abandon sweep ended while it was remembered here refuses the next step, and nothing is stored', async () => {
    const id = await start();
    const a = await step(id, 'killLead', null);
    await env.runtime.deps.sequelize.query(`UPDATE diagnoses SET last_activity_at = now() - interval '48 hours' WHERE id = :id`, { replacements: { id } });
    await markAbandoned(env.runtime.deps);
    const res = await tech.post(`/api/diagnoses/${id}/steps`, stepBody('sparkTest', a.id, { answerId: 'none' }));
    expect(res.status).toBe(409);
    expect(expectEnvelope(res.body).code).toBe('diagnosis_ended');
    expect(await DiagnosisStep.count({ where: { diagnosisId: id } })).toBe(1);
  });

  it('the same step sent five times at once is stored once', async () => {
    const id = await start();
    const body = stepBody('killLead', null);
    const answers = await Promise.all(Array.from({ length: 5 }, () => tech.post(`/api/diagnoses/${id}/steps`, body)));
    expect(answers.map((r) => r.status).sort()).toEqual([200, 200, 200, 200, 201]);
    expect(await DiagnosisStep.count({ where: { diagnosisId: id } })).toBe(1);
  });

  it('two different answers racing for the same place: both are stored in order, the later one supersedes', async () => {
    const id = await start();
    const a = await step(id, 'killLead', null);
    const [x, y] = await Promise.all([
      tech.post(`/api/diagnoses/${id}/steps`, stepBody('sparkTest', a.id, { answerId: 'none' })),
      tech.post(`/api/diagnoses/${id}/steps`, stepBody('sparkTest', a.id, { answerId: 'strong' })),
    ]);
    expect([x.status, y.status]).toEqual([201, 201]);
    const rows = (await tech.get(`/api/diagnoses/${id}`).expect(200)).body.steps as { seq: number; superseded: boolean }[];
    expect(rows.map((r) => [r.seq, r.superseded])).toEqual([[1, false], [2, true], [3, false]]);
  });

  it('a DANGER step is refused until its note is acknowledged', async () => {
    const id = await start();
    const a = await step(id, 'killLead', null);
    const b = await step(id, 'sparkTest', a.id, { answerId: 'none' });
    const c = await step(id, 'exciter', b.id, { entered: '150' });
    const refused = await tech.post(`/api/diagnoses/${id}/steps`, stepBody('pulser', c.id, { entered: '120' }));
    expect(refused.status).toBe(422);
    expect(expectEnvelope(refused.body).code).toBe('not_acknowledged');
    await step(id, 'pulser', c.id, { entered: '120', acknowledged: true, acknowledgedAt: '2026-12-02T10:42:05.000Z' });
    // The time of the acknowledgement stays in the record (issue 11 point 2).
    const rec = await tech.get(`/api/diagnoses/${id}`).expect(200);
    const pulser = (rec.body as { steps: { stepId: string; shown: { acknowledged?: boolean; acknowledgedAt?: string } }[] }).steps.find((s) => s.stepId === 'pulser');
    expect(pulser?.shown).toMatchObject({ acknowledged: true, acknowledgedAt: '2026-12-02T10:42:05.000Z' });
  });
});

describe('the demo "No spark" procedure on the server', () => {
  it('nulls the test leads and corrects the copper coil primary to 20 °C with the engine temperature', async () => {
    const v = (await tech.get('/api/bench/procedures/no-spark').expect(200)).body as { id: string };
    const body = { ...startBody(world), procedureVersionId: v.id };
    await tech.post('/api/diagnoses', body).expect(201);
    const id = body.id;
    const a = await step(id, 'prepare', null);
    const b = await step(id, 'sparkTest', a.id, { answerId: 'none', acknowledged: true });
    const c = await step(id, 'isolateStop', b.id);
    const d = await step(id, 'sparkRetest', c.id, { answerId: 'no', acknowledged: true });
    const e = await step(id, 'capOhms', d.id, { entered: '4K7' });
    expect(e.value).toBe(4700); // IEC 60062: the letter K stands for the decimal point and ×10³
    const f = await step(id, 'groundCheck', e.id, { entered: '0,4', leadEntered: '0.1' });
    expect(f.value).toBeCloseTo(0.3, 12);
    const g = await step(id, 'engineTemp', f.id, { entered: '30' });
    const h = await step(id, 'coilPrimary', g.id, { entered: '0.6', leadEntered: '0.1' });
    // IEC 60028 (annealed copper, α20 = 0.00393 /°C): R20 = Rt / (1 + α20·(t − 20)) = 0.5 / 1.0393
    expect(h.value).toBeCloseTo(0.5 / (1 + 0.00393 * (30 - 20)), 9);
    expect(h).toMatchObject({ verdict: 'within', next: 'coilSecondary' });
  });
});

describe('hand-off, abandon and coaching notes', () => {
  it('a hand-off ends the diagnosis and e-mails the shop leads', async () => {
    const id = await start();
    const a = await step(id, 'killLead', null);
    const b = await step(id, 'sparkTest', a.id, { answerId: 'weak' });
    expect(b.next).toBe('senior');
    await step(id, 'senior', b.id, { outcome: { reason: 'Weak orange spark, suspect the CDI' } });
    const mail = await env.smtp.waitFor((m) => m.subject.startsWith('Hand-off') && m.to.includes('lead@larkspur.test'));
    expect(mail.text).toContain('Weak orange spark');
    expect((await Diagnosis.findByPk(id))!.status).toBe('handed_off');
  });

  it('a hand-off without a reason is refused and nothing is stored', async () => {
    const id = await start();
    const a = await step(id, 'killLead', null);
    const b = await step(id, 'sparkTest', a.id, { answerId: 'weak' });
    const res = await tech.post(`/api/diagnoses/${id}/steps`, stepBody('senior', b.id, { outcome: { reason: '' } }));
    expect(res.status).toBe(400);
    expect(await DiagnosisStep.count({ where: { diagnosisId: id } })).toBe(2);
  });

  it('marks a diagnosis left past the shop abandon time as abandoned, and leaves a fresh one', async () => {
    const old = await start();
    const fresh = await start();
    await env.runtime.deps.sequelize.query(`UPDATE diagnoses SET last_activity_at = now() - interval '25 hours' WHERE id = :old`, { replacements: { old } });
    const count = await markAbandoned(env.runtime.deps);
    expect((await Diagnosis.findByPk(old))!.status).toBe('abandoned');
    expect((await Diagnosis.findByPk(fresh))!.status).toBe('active');
    expect((await tech.get('/api/diagnoses?status=active').expect(200)).body.map((d: { id: string }) => d.id)).not.toContain(old);
    // markAbandoned reports how many it marked (for the housekeeping log).
    expect(count).toBe(1);
  });

  it('shows trainers coaching notes to the technician, who cannot write them', async () => {
    const id = await start();
    const trainer = (await User.findOne({ where: { email: 'trainer@larkspur.test' } }))!;
    await CoachingNote.create({ shopId: world.shopId, diagnosisId: id, stepId: null, authorId: trainer.id, body: 'Check the kill switch first next time.' });
    const rec = await tech.get(`/api/diagnoses/${id}`).expect(200);
    expect(rec.body.coachingNotes[0]).toMatchObject({ body: 'Check the kill switch first next time.', authorName: 'Jordan Trainer' });
    expect((await tech.post(`/api/diagnoses/${id}/coaching-notes`, { body: 'x' })).status).toBe(404);
  });
});

describe('shops and owners', () => {
  it('a technician of another shop can neither see nor write the diagnosis (404)', async () => {
    const id = await start();
    const other = await otherShopMember(env, ['technician', 'lead']);
    expect((await other.get(`/api/diagnoses/${id}`)).status).toBe(404);
    const write = await other.post(`/api/diagnoses/${id}/steps`, stepBody('killLead', null));
    expect(write.status).toBe(404);
    expectEnvelope(write.body);
    expect((await other.post(`/api/diagnoses/${id}/report`, {})).status).toBe(404);
    expect(await DiagnosisStep.count({ where: { diagnosisId: id } })).toBe(0);
  });

  it('a trainer may read a diagnosis but not record steps in it', async () => {
    const id = await start();
    const trainer = await signInAs(env.app, 'trainer');
    await trainer.get(`/api/diagnoses/${id}`).expect(200);
    expect((await trainer.post(`/api/diagnoses/${id}/steps`, stepBody('killLead', null))).status).toBe(403);
  });
});
