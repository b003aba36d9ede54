import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { loopStep, publishLoopProcedure, Session, startBody, type Answer, type LoopWorld } from '../faults/bench-session';
import { startAppProcess, throwawayDatabase, sleep, type AppProcess, type Database } from '../faults/processes';

// Two real app server processes on one throwaway PostgreSQL (.tmp/pg-two-servers), with no
// balancer: each request names the server it goes to, and one session cookie is used on both,
// as a balancer without sticky sessions would do.

let db: Database;
let a: AppProcess;
let b: AppProcess;
let world: LoopWorld;
let check: pg.Client;

beforeAll(async () => {
  db = await throwawayDatabase('two-servers');
  a = await startAppProcess(db.url); // migrates and seeds the demo shop
  b = await startAppProcess(db.url); // finds both done
  world = await publishLoopProcedure(db.url);
  check = new pg.Client({ connectionString: db.url });
  await check.connect();
}, 120_000);
afterAll(async () => {
  await check?.end();
  await a?.stop();
  await b?.stop();
  await db?.remove();
}, 60_000);

/** Sends until the answer has `status`, for at most 3 s; resolves with the milliseconds it took (Infinity if never). */
async function msUntil(send: () => Promise<Answer>, status: number): Promise<number> {
  const t0 = performance.now();
  while (performance.now() - t0 < 3000) {
    if ((await send()).status === status) return performance.now() - t0;
    await sleep(25);
  }
  return Number.POSITIVE_INFINITY;
}

async function startDiagnosis(tech: Session, on: AppProcess): Promise<string> {
  const start = startBody(world);
  const res = await tech.post(on.base, '/api/diagnoses', start);
  expect(res.status).toBe(201);
  return start.id;
}

describe('two app servers on one database', () => {
  it('the same step id posted 20 times at once, half to each server, is stored once; the same id with another reading is refused', async () => {
    const tech = await Session.signIn(a.base, 'tech@larkspur.test');
    const diagnosisId = await startDiagnosis(tech, a);
    const step = loopStep(null, '0,15k');
    const answers = await Promise.all(Array.from({ length: 20 }, (_, i) => tech.post((i % 2 ? b : a).base, `/api/diagnoses/${diagnosisId}/steps`, step)));

    expect(answers.map((r) => r.status).sort()).toEqual([...Array(19).fill(200), 201]); // one stored, 19 told it already was
    expect(new Set(answers.map((r) => r.body.seq))).toEqual(new Set([answers[0]!.body.seq]));
    const { rows } = await check.query('SELECT id FROM diagnosis_steps WHERE diagnosis_id = $1', [diagnosisId]);
    expect(rows).toEqual([{ id: step.id }]);

    for (const server of [a, b]) {
      const reused = await tech.post(server.base, `/api/diagnoses/${diagnosisId}/steps`, { ...step, entered: '0,12k' });
      expect(reused.status).toBe(422);
      expect((reused.body.error as { code: string }).code).toBe('id_reused');
    }
    expect((await check.query('SELECT count(*)::int AS n FROM diagnosis_steps WHERE diagnosis_id = $1', [diagnosisId])).rows[0].n).toBe(1);
  });

  it('a sign-out on one server is refused on the other within one second', async () => {
    const tech = await Session.signIn(a.base, 'tech@larkspur.test');
    expect((await tech.get(b.base, '/api/auth/me')).status).toBe(200); // now cached on b
    expect((await tech.post(a.base, '/api/auth/logout')).status).toBe(204);
    expect(await msUntil(() => tech.get(b.base, '/api/auth/me'), 401)).toBeLessThan(1000);
  });

  it('a role given and taken on one server applies on the other within one second', async () => {
    const admin = await Session.signIn(a.base, 'admin@larkspur.test');
    const author = await Session.signIn(b.base, 'author@larkspur.test');
    expect((await author.get(b.base, '/api/shop/members')).status).toBe(403); // the author's roles are now cached on b
    const members = (await admin.get(a.base, '/api/shop/members')).body as unknown as { id: string; email: string; roles: string[] }[];
    const member = members.find((m) => m.email === 'author@larkspur.test')!;

    expect((await admin.patch(a.base, `/api/shop/members/${member.id}`, { roles: [...member.roles, 'admin'] })).status).toBe(200);
    expect(await msUntil(() => author.get(b.base, '/api/shop/members'), 200)).toBeLessThan(1000);
    expect((await admin.patch(a.base, `/api/shop/members/${member.id}`, { roles: member.roles })).status).toBe(200);
    expect(await msUntil(() => author.get(b.base, '/api/shop/members'), 403)).toBeLessThan(1000);
  });

  it('a password reset on one server ends the sessions on the other within one second', async () => {
    const lead = await Session.signIn(b.base, 'lead@larkspur.test');
    expect((await lead.get(b.base, '/api/auth/me')).status).toBe(200);
    const visitor = await Session.anonymous(a.base);
    expect((await visitor.post(a.base, '/api/auth/password/forgot', { email: 'lead@larkspur.test' })).status).toBe(202);
    const admin = await Session.signIn(a.base, 'admin@larkspur.test');
    let token = '';
    for (let i = 0; i < 50 && !token; i++) {
      const mail = (await admin.get(a.base, '/api/shop/mail')).body as unknown as { to: string[]; subject: string; text: string }[];
      const reset = mail.find((m) => m.to.includes('lead@larkspur.test') && m.subject.includes('Reset'));
      token = reset ? (/\/reset-password\?token=([\w-]+)/.exec(reset.text)?.[1] ?? '') : '';
      if (!token) await sleep(100);
    }
    expect(token).not.toBe('');
    expect((await visitor.post(a.base, '/api/auth/password/reset', { token, password: 'lead-new-password-2' })).status).toBe(204);
    expect(await msUntil(() => lead.get(b.base, '/api/auth/me'), 401)).toBeLessThan(1000);
  });

  it('a diagnosis started on one server and stepped on both, going back once, reads the same from each', async () => {
    const tech = await Session.signIn(a.base, 'tech@larkspur.test');
    const diagnosisId = await startDiagnosis(tech, a);
    const servers = [b, a];
    const sent: string[] = [];
    let after: string | null = null;
    // six readings alternating between the servers, then a re-measure that follows the second
    // one (the four after it are superseded), sent to the server that did not store the last
    for (const [i, entered] of ['0,15k', '95', '0,16k', '210', '150', '0,12k'].entries()) {
      const step = loopStep(after, entered);
      const res = await tech.post(servers[i % 2]!.base, `/api/diagnoses/${diagnosisId}/steps`, step);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      sent.push(step.id);
      after = step.id;
    }
    const again = loopStep(sent[1]!, '0,14k');
    expect((await tech.post(b.base, `/api/diagnoses/${diagnosisId}/steps`, again)).status).toBe(201);
    const next = loopStep(again.id, '0,13k');
    expect((await tech.post(a.base, `/api/diagnoses/${diagnosisId}/steps`, next)).status).toBe(201);

    const fromA = (await tech.get(a.base, `/api/diagnoses/${diagnosisId}`)).body as { steps: { id: string; seq: number; superseded: boolean }[] };
    const fromB = (await tech.get(b.base, `/api/diagnoses/${diagnosisId}`)).body;
    expect(fromB).toEqual(fromA);
    expect(fromA.steps.filter((s) => !s.superseded).map((s) => s.id)).toEqual([sent[0], sent[1], again.id, next.id]);
    expect(fromA.steps.filter((s) => s.superseded).map((s) => s.id)).toEqual(sent.slice(2));
    expect(new Set(fromA.steps.map((s) => s.seq)).size).toBe(fromA.steps.length);
  });
});
