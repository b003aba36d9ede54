// The cluster of `npm run cluster` (scripts/cluster.sh --throwaway): HAProxy in front of two app
// servers, a PostgreSQL primary and its streaming replica. A technician walks *No spark* through
// the balancer while one app server is killed half-way; Debrief is read from the replica, then
// from the primary once the replica is stopped. CLUSTER_FULL=1 (npm run verify:cluster) adds the
// replica's return and the shared mailbox.
import { spawn, execFileSync, type ChildProcess } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import pg from 'pg';

const ROOT = path.resolve('.tmp/cluster-test');
const FULL = process.env.CLUSTER_FULL === '1';
// The short run (npm test) leaves the full run's checks out instead of counting them as skipped.
const itWhenFull = (name: string, check: () => Promise<void>, timeout?: number): void => {
  if (FULL) it(name, check, timeout);
};
let cluster: ChildProcess;
let run: Record<string, string>;
let base = '';

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const freePort = (from: number): Promise<number> => new Promise((resolve) => {
  const s = createServer();
  s.once('error', () => resolve(freePort(from + 1)));
  s.listen(from, '127.0.0.1', () => s.close(() => resolve(from)));
});

beforeAll(async () => {
  const port = await freePort(4600 + Math.floor(Math.random() * 200));
  cluster = spawn('bash', ['scripts/cluster.sh', '--throwaway'], { env: { ...process.env, PORT: String(port), CLUSTER_ROOT: ROOT }, stdio: ['ignore', 'inherit', 'inherit'] });
  const envFile = path.join(ROOT, 'run.env');
  for (let i = 0; !existsSync(envFile); i++) {
    if (cluster.exitCode !== null || i > 900) throw new Error('the cluster did not come up');
    await sleep(200);
  }
  run = Object.fromEntries(readFileSync(envFile, 'utf8').trim().split('\n').map((l) => [l.slice(0, l.indexOf('=')), l.slice(l.indexOf('=') + 1)]));
  base = `http://127.0.0.1:${run.PORT}`;
  console.log(`cluster started in ${run.STARTED_IN_MS} ms`);
}, 200_000);

afterAll(async () => {
  if (!cluster || cluster.exitCode !== null) return;
  cluster.kill('SIGINT');
  await new Promise((r) => cluster.once('exit', r));
}, 60_000);

/** A browser through the balancer: a cookie jar, the CSRF token, and the outbox's retry rule. */
class Phone {
  readonly agent = request.agent(base);
  csrf = '';
  async signIn(who: string) {
    this.csrf = (await this.agent.get('/api/auth/csrf').expect(200)).body.token;
    const res = await this.agent.post('/api/auth/login').set('X-CSRF-Token', this.csrf).send({ email: `${who}@larkspur.test`, password: 'spark-demo-2026' }).expect(200);
    this.csrf = res.body.csrfToken;
  }
  get(url: string) { return this.agent.get(url); }
  /** Sends one message until it is answered, as the Bench outbox does: a lost connection, 408, 429 and 5xx are tried again. */
  async send(url: string, body: object, tries: { n: number } = { n: 0 }): Promise<request.Response> {
    for (;;) {
      tries.n++;
      const res = await this.agent.post(url).set('X-CSRF-Token', this.csrf).send(body).catch(() => null);
      if (res && res.status < 500 && res.status !== 408 && res.status !== 429) return res;
      if (tries.n > 50) throw new Error(`${url}: no answer after ${tries.n} tries`);
      await sleep(200);
    }
  }
}

// The answers a technician gives on this walk (the limits are the demo's illustrative ones):
// every input to the CDI tests good, and a known-good CDI restores the spark.
const ANSWERS: Record<string, object> = {
  sparkTest: { answerId: 'none' }, sparkRetest: { answerId: 'no' }, capOhms: { entered: '5k' },
  groundCheck: { entered: '0.2', leadEntered: '0.05' }, engineTemp: { entered: '20' },
  coilPrimary: { entered: '0.5', leadEntered: '0.05' }, coilSecondary: { entered: '3.3k' },
  exciterOhms: { entered: '300' }, exciterPeak: { entered: '150' }, pulserOhms: { entered: '200' },
  pulserGap: { entered: '0.6' }, pulserPeak: { entered: '2' }, sparkAfterSwap: { answerId: 'yes' },
  cdiFaulty: { outcome: { partsFitted: [{ name: 'CDI unit', lot: 'C-1204' }], finalCheck: { spark: true, runs: true, stops: true }, labourMinutes: 60 } },
};

/** Reads of the diagnoses table on one server so far (the replica keeps its own statistics). */
async function diagnosesScans(url: string): Promise<number> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    await c.query('SELECT pg_stat_clear_snapshot()');
    const { rows } = await c.query<{ n: string }>(`SELECT (seq_scan + coalesce(idx_scan, 0))::text AS n FROM pg_stat_user_tables WHERE relname = 'diagnoses'`);
    return Number(rows[0]!.n);
  } finally { await c.end(); }
}
/** Waits for a server's statistics (flushed about once a second) to count more reads than `before`. */
async function scannedSince(url: string, before: number): Promise<boolean> {
  for (let i = 0; i < 25; i++) { if (await diagnosesScans(url) > before) return true; await sleep(200); }
  return false;
}

let diagnosisId = '';
let sent = 0;

describe('a cluster of two app servers behind HAProxy, with a read replica', () => {
  it('keeps every step of a No spark walk exactly once when one app server is killed half-way', async () => {
    const tech = new Phone();
    await tech.signIn('tech');
    const version = (await tech.get('/api/bench/procedures/no-spark').expect(200)).body;
    const vehicle = (await tech.get('/api/vehicles').expect(200)).body[0];
    const meter = (await tech.get('/api/shop/meters').expect(200)).body[0];
    diagnosisId = randomUUID();
    const start = { id: diagnosisId, procedureVersionId: version.versionId ?? version.id, vehicleId: vehicle.id, meterId: meter.id, complaint: 'Cranks, no spark', conditions: { engine: 'cold', ambientC: 18, startingMethod: 'kick', batteryVolts: null }, startedAt: new Date().toISOString() };
    expect((await tech.send('/api/diagnoses', start)).status).toBe(201);

    let stepId: string | null = version.document.start;
    let after: string | null = null;
    const walked: string[] = [];
    const tries = { n: 0 };
    while (stepId) {
      if (walked.length === 7) process.kill(Number(run.APP1_PID), 'SIGKILL'); // mid-diagnosis, no warning
      const now = new Date().toISOString();
      const body: Record<string, unknown> & { id: string } = { id: randomUUID(), after, stepId, startedAt: now, answeredAt: now, acknowledged: true, ...(ANSWERS[stepId] ?? {}) };
      const res: request.Response = await tech.send(`/api/diagnoses/${diagnosisId}/steps`, body, tries);
      expect(res.status, `${stepId}: ${JSON.stringify(res.body.error ?? '')}`).toBe(201);
      if (walked.length === 8) {
        // the phone never heard the answer and sends the same step again: stored once
        const again = await tech.send(`/api/diagnoses/${diagnosisId}/steps`, body, tries);
        expect(again.body.duplicate).toBe(true);
      }
      walked.push(stepId);
      after = body.id;
      stepId = res.body.next;
      if (res.body.status === 'finished') break;
    }
    sent = walked.length;
    expect(walked.at(-1)).toBe('cdiFaulty');
    const record = (await tech.get(`/api/diagnoses/${diagnosisId}`).expect(200)).body;
    expect(record.status).toBe('finished');
    expect(record.steps.map((s: { stepId: string }) => s.stepId)).toEqual(walked);
    const db = new pg.Client({ connectionString: run.DATABASE_URL });
    await db.connect();
    const { rows } = await db.query<{ n: number; ids: number }>('SELECT count(*)::int AS n, count(DISTINCT id)::int AS ids FROM diagnosis_steps WHERE diagnosis_id = $1', [diagnosisId]);
    await db.end();
    expect(rows[0]).toEqual({ n: walked.length, ids: walked.length });
    console.log(`${walked.length} steps, ${tries.n} sends (retries included) through the balancer with app server 1 killed after step 7`);
  }, 60_000);

  it('serves Debrief analytics and lists from the replica, which has the walk replicated', async () => {
    const trainer = new Phone();
    await trainer.signIn('trainer');
    const health = (await trainer.get('/api/health').expect(200)).body;
    expect(health.replica).toMatchObject({ state: 'in use', debriefReadsFrom: 'replica' });
    console.log(`replica lag seen by the app server: ${health.replica.lagSeconds} s`);
    const before = await diagnosesScans(run.DATABASE_REPLICA_URL!);
    const procs = (await trainer.get('/api/debrief/procedures').expect(200)).body as { procedureId?: string; id?: string; slug?: string; title: string }[];
    const noSpark = procs.find((p) => p.title === 'No spark')!;
    const steps = (await trainer.get(`/api/debrief/analytics/steps?procedureId=${noSpark.procedureId ?? noSpark.id}`).expect(200)).body;
    expect(steps).toBeTruthy();
    // another user's write reaches the replica within the allowed lag (REPLICA_MAX_LAG_SECONDS, 5 s)
    let listed: string[] = [];
    for (let i = 0; i < 25 && !listed.includes(diagnosisId); i++) {
      if (i) await sleep(200);
      listed = (await trainer.get('/api/debrief/diagnoses?status=finished').expect(200)).body.rows.map((d: { id: string }) => d.id);
    }
    expect(listed).toContain(diagnosisId);
    expect(await scannedSince(run.DATABASE_REPLICA_URL!, before)).toBe(true);
    const replica = new pg.Client({ connectionString: run.DATABASE_REPLICA_URL });
    await replica.connect();
    const { rows } = await replica.query(`SELECT count(*)::int AS n FROM pg_stat_activity WHERE application_name = 'sparkwright-debrief-reads'`);
    await replica.end();
    expect(rows[0].n).toBeGreaterThan(0);
  }, 30_000);

  it('answers Debrief from the primary when the replica is stopped, and says so on /api/health', async () => {
    execFileSync('bash', ['scripts/pg.sh', 'stop'], { env: { ...process.env, PG_ROOT: run.REPLICA_ROOT }, stdio: 'inherit' });
    const trainer = new Phone();
    await trainer.signIn('trainer');
    const before = await diagnosesScans(run.DATABASE_URL!);
    const list = (await trainer.get('/api/debrief/diagnoses?status=finished').expect(200)).body;
    expect(list.rows.map((d: { id: string }) => d.id)).toContain(diagnosisId);
    expect(await scannedSince(run.DATABASE_URL!, before)).toBe(true);
    await sleep(1500); // one poll
    const health = (await trainer.get('/api/health').expect(200)).body;
    expect(health).toMatchObject({ ok: true, replica: { state: 'down', debriefReadsFrom: 'primary' } });
    expect(sent).toBeGreaterThan(10);
  }, 30_000);

  itWhenFull('goes back to the replica once it runs again', async () => {
    execFileSync('bash', ['scripts/pg.sh', 'replica', run.PRIMARY_ROOT!, '--throwaway'], { env: { ...process.env, PG_ROOT: run.REPLICA_ROOT }, stdio: ['ignore', 'ignore', 'inherit'] });
    const trainer = new Phone();
    for (let i = 0; i < 50; i++) {
      const health = (await trainer.get('/api/health').expect(200)).body;
      if (health.replica.state === 'in use') return;
      await sleep(200);
    }
    throw new Error('the replica was not used again within 10 s');
  }, 30_000);

  itWhenFull('shows the report e-mail sent through the cluster on the surviving app server: the fakes are one shared process', async () => {
    const tech = new Phone();
    await tech.signIn('tech');
    await tech.send(`/api/diagnoses/${diagnosisId}/report`, {}).then((r) => expect(r.status).toBe(200));
    const admin = request.agent(`http://127.0.0.1:${run.APP2_PORT}`);
    const csrf = (await admin.get('/api/auth/csrf').expect(200)).body.token;
    await admin.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email: 'admin@larkspur.test', password: 'spark-demo-2026' }).expect(200);
    const mail = (await admin.get('/api/shop/mail').expect(200)).body as { subject: string }[];
    expect(mail.some((m) => m.subject.startsWith('Diagnosis report'))).toBe(true);
  }, 30_000);

  it('stops every part on Ctrl-C', async () => {
    cluster.kill('SIGINT');
    await new Promise((r) => cluster.once('exit', r));
    for (const port of [run.PORT, run.APP2_PORT]) {
      await expect(fetch(`http://127.0.0.1:${port}/api/health`)).rejects.toThrow();
    }
    expect(existsSync(path.join(run.PRIMARY_ROOT!, 'data', 'postmaster.pid'))).toBe(false);
  }, 60_000);
});
