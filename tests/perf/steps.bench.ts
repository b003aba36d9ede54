// npm run perf:steps — recording Bench steps through the real endpoint (session, CSRF, shop and
// role checks, the re-check against the pinned version, one transaction) against a bare endpoint
// on the same server that does one plain INSERT with pg. Both under autocannon, 50 connections,
// in one run. Targets: steps ≥ 50 % of the bare throughput, p99 ≤ 2.5 × the bare p99, zero errors.
// `-- --cluster`: the same comparison through HAProxy in front of two such server processes.
import { randomUUID } from 'node:crypto';
import { fork, spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import inspector from 'node:inspector/promises';
import { cpus, tmpdir } from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import express from 'express';
import pg from 'pg';
import autocannon from 'autocannon';
import { loadConfig } from '../../server/config';
import { startRuntime } from '../../server/runtime';
import { createApp } from '../../server/app';
import { seedDemo } from '../../server/seeders/demo';
import { Meter, Procedure, ProcedureVersion, Shop, User, Vehicle } from '../../server/models';
import { doc } from '../shared/fixtures';

const CONNECTIONS = 50;
const DURATION = Number(process.env.PERF_SECONDS ?? 10);
const STEPS_PER_DIAGNOSIS = 30; // a long real diagnosis; then the connection moves to a fresh one
const PASSWORD = 'perf-demo-password';

// A Reading whose every band comes back to itself: each request is a valid next step that parses
// "0,15k" and decides it with the meter's uncertainty, like a real reading.
const loopDoc = doc([{
  id: 'exciter', kind: 'reading', title: 'Exciter winding', quantity: 'resistance', unit: 'Ω', limits: { kind: 'range', min: 100, max: 200 },
  bands: [
    { id: 'low', label: 'Below', upper: { value: 100, inclusive: false }, next: 'exciter' },
    { id: 'ok', label: 'Within', lower: { value: 100, inclusive: true }, upper: { value: 200, inclusive: true }, next: 'exciter' },
    { id: 'high', label: 'Above', lower: { value: 200, inclusive: false }, next: 'exciter' },
  ],
}]);

async function setUp() {
  const config = loadConfig({
    ...process.env, NODE_ENV: 'test', PORT: '0', SMTP_PORT: '0', DEMO_PASSWORD: PASSWORD, SERVE_CLIENT: '0', LOCAL_FAKES: '1',
    DATA_DIR: mkdtempSync(path.join(tmpdir(), 'sw-perf-')), LOGIN_RATE_LIMIT: '100000',
  });
  const runtime = await startRuntime(config);
  // the second server of --cluster shares the first one's demo shop and diagnoses
  if (process.env.PERF_SECOND === '1') return { runtime, ...(await listen(runtime, config.DATABASE_URL)), diagnoses: [] };
  await seedDemo(runtime.deps);
  const shop = (await Shop.findOne({ where: { slug: 'larkspur-lane' } }))!;
  const tech = (await User.findOne({ where: { email: 'tech@larkspur.test' } }))!;
  const [proc] = await Procedure.findOrCreate({ where: { shopId: shop.id, slug: 'perf-loop' }, defaults: { shopId: shop.id, slug: 'perf-loop', title: 'Perf loop', symptom: 'No spark', ignitionSystem: 'magneto-cdi', archivedAt: null, createdBy: null } });
  const version = await ProcedureVersion.create({ shopId: shop.id, procedureId: proc.id, number: Date.now() % 1e6, status: 'published', document: loopDoc as never, basedOnId: null, createdBy: null, updatedBy: null, publishedBy: null, publishedAt: new Date(), retiredAt: null });
  const vehicle = (await Vehicle.findOne({ where: { shopId: shop.id } }))!;
  const meter = (await Meter.findOne({ where: { shopId: shop.id } }))!;
  const diagnoses = Array.from({ length: 4000 }, () => randomUUID());
  await runtime.deps.sequelize.query(
    `INSERT INTO diagnoses (id, shop_id, procedure_version_id, vehicle_id, technician_id, meter_id, complaint)
     SELECT unnest(ARRAY[:ids]::uuid[]), :shop, :version, :vehicle, :tech, :meter, 'benchmark'`,
    { replacements: { ids: diagnoses, shop: shop.id, version: version.id, vehicle: vehicle.id, tech: tech.id, meter: meter.id } });
  await runtime.deps.sequelize.query('CREATE TABLE IF NOT EXISTS perf_bare_steps (id uuid PRIMARY KEY, diagnosis_id uuid NOT NULL, body jsonb NOT NULL, created_at timestamptz NOT NULL DEFAULT now())');

  return { runtime, ...(await listen(runtime, config.DATABASE_URL)), diagnoses };
}

async function listen(runtime: Awaited<ReturnType<typeof startRuntime>>, databaseUrl: string) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 10 });
  // The bare endpoint lives only here, on the same app ahead of its middleware: JSON in, one
  // INSERT, JSON out.
  const app = createApp(runtime.deps, (first) => first.post('/bare', express.json(), async (req, res) => {
    const body = req.body as { id: string; diagnosisId: string };
    await pool.query('INSERT INTO perf_bare_steps (id, diagnosis_id, body) VALUES ($1, $2, $3)', [body.id, body.diagnosisId, body]);
    res.status(201).json({ id: body.id });
  }));
  const server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return { pool, server, base };
}

/** One signed-in session per connection, so that session writes do not queue on one row. */
async function signIn(base: string): Promise<{ cookie: string; csrf: string }> {
  const first = await fetch(`${base}/api/auth/csrf`);
  const cookie0 = first.headers.get('set-cookie')!.split(';')[0]!;
  const { token } = (await first.json()) as { token: string };
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST', headers: { 'content-type': 'application/json', cookie: cookie0, 'x-csrf-token': token },
    body: JSON.stringify({ email: 'tech@larkspur.test', password: PASSWORD }),
  });
  if (login.status !== 200) throw new Error(`sign-in failed: ${login.status} ${await login.text()}`);
  return { cookie: login.headers.get('set-cookie')!.split(';')[0]!, csrf: ((await login.json()) as { csrfToken: string }).csrfToken };
}

/** A chain of steps on one diagnosis; a lane is held by one request at a time. */
interface Lane { session?: { cookie: string; csrf: string } | undefined; diagnosis: string; after: string | null; count: number }

function run(opts: { url: string; sessions?: { cookie: string; csrf: string }[]; diagnoses: string[]; bare: boolean; floor?: string }): Promise<autocannon.Result> {
  let nextDiagnosis = 0;
  const fresh = () => opts.diagnoses[nextDiagnosis++ % opts.diagnoses.length]!;
  // autocannon resets a connection's context after each (one-request) sequence, so the chains
  // live here: a request takes a free lane and gives it back with its response.
  const free: Lane[] = Array.from({ length: CONNECTIONS + 10 }, (_, i) => ({ session: opts.sessions?.[i % opts.sessions.length], diagnosis: fresh(), after: null, count: 0 }));
  return new Promise((resolve, reject) => {
    autocannon({
      url: opts.url, connections: CONNECTIONS, duration: DURATION, method: 'POST',
      requests: [{
        setupRequest: (req: autocannon.Request, context: { lane?: Lane; pending?: string }) => {
          const lane = free.pop()!;
          if (lane.count >= STEPS_PER_DIAGNOSIS) Object.assign(lane, { diagnosis: fresh(), after: null, count: 0 });
          const now = new Date().toISOString();
          context.lane = lane;
          context.pending = randomUUID();
          const body = { id: context.pending, after: lane.after, stepId: 'exciter', entered: '0,15k', note: '', startedAt: now, answeredAt: now };
          if (opts.floor) return { ...req, method: 'GET', path: opts.floor, headers: { cookie: lane.session!.cookie }, body: undefined };
          return {
            ...req,
            path: opts.bare ? '/bare' : `/api/diagnoses/${lane.diagnosis}/steps`,
            headers: { 'content-type': 'application/json', ...(lane.session ? { cookie: lane.session.cookie, 'x-csrf-token': lane.session.csrf } : {}) },
            body: JSON.stringify(opts.bare ? { ...body, diagnosisId: lane.diagnosis } : body),
          };
        },
        onResponse: (status: number, _body: string, context: { lane?: Lane; pending?: string }) => {
          const lane = context.lane!;
          if (status === 201) { lane.after = context.pending!; lane.count++; }
          if (opts.floor && status !== 200) throw new Error(`the floor request failed: ${status}`);
          free.push(lane);
        },
      }],
    } as autocannon.Options, (err, result) => (err ? reject(err) : resolve(result)));
  });
}

const summary = (name: string, r: Measured) =>
  `${name.padEnd(6)} ${r.requests.average.toFixed(0).padStart(6)} req/s   p50 ${String(r.latency.p50).padStart(4)} ms   p99 ${String(r.latency.p99).padStart(4)} ms   `
  + `CPU/req server ${r.cpuUs.toFixed(0).padStart(4)} µs, PostgreSQL ${r.postgresUs.toFixed(0).padStart(4)} µs, autocannon ${r.clientUs.toFixed(0).padStart(4)} µs, machine ${r.machineUs.toFixed(0).padStart(4)} µs   errors ${r.errors}   non-2xx ${r.non2xx}`;

/** The server side: its own process, so autocannon does not share its event loop. */
async function serve(): Promise<void> {
  const env = await setUp();
  process.send!({ base: env.base, diagnoses: env.diagnoses });
  const profiler = process.env.PERF_PROFILE ? new inspector.Session() : null;
  profiler?.connect();
  process.on('message', (m) => {
    if (m === 'profile-start' && profiler) void profiler.post('Profiler.enable').then(() => profiler.post('Profiler.start')).then(() => process.send!('profiling'));
    if (typeof m === 'string' && m.startsWith('profile-stop:') && profiler) {
      void profiler.post('Profiler.stop').then(({ profile }) => {
        mkdirSync('.tmp/prof', { recursive: true });
        writeFileSync(`.tmp/prof/${m.slice('profile-stop:'.length)}.cpuprofile`, JSON.stringify(profile));
        process.send!('profiled');
      });
    }
    if (m === 'cpu') process.send!({ cpu: process.cpuUsage() });
    if (m !== 'stop') return;
    env.server.close();
    // let in-flight requests finish before the pools close
    setTimeout(() => void env.pool.end().then(() => env.runtime.close()).then(() => process.exit(0)), 1000);
  });
}

/** The server process' CPU time (user + system, µs) so far. */
function serverCpu(child: ChildProcess): Promise<number> {
  return new Promise((resolve) => {
    const on = (m: unknown) => {
      const cpu = (m as { cpu?: NodeJS.CpuUsage }).cpu;
      if (cpu) { child.off('message', on); resolve(cpu.user + cpu.system); }
    };
    child.on('message', on);
    child.send('cpu');
  });
}

/** Busy CPU time of the whole machine so far (µs), from /proc/stat: server, PostgreSQL, autocannon. */
function machineCpu(): number {
  const [, ...ticks] = readFileSync('/proc/stat', 'utf8').split('\n')[0]!.trim().split(/\s+/).map(Number);
  const idle = ticks[3]! + ticks[4]!; // idle + iowait
  return ((ticks.slice(0, 8).reduce((a, b) => a + b, 0) - idle) * 1e6) / 100; // USER_HZ is 100 on Linux
}

/**
 * CPU time of PostgreSQL so far (µs), from /proc: the postmaster's own and its reaped children's
 * (a backend that closed during a run is counted there), plus every backend still running.
 */
function postgresCpu(): number {
  let ticks = 0;
  for (const pid of readdirSync('/proc').filter((d) => /^\d+$/.test(d))) {
    try {
      const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
      if (!stat.includes('(postgres)')) continue;
      const f = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      ticks += Number(f[11]) + Number(f[12]); // utime, stime
      if (!readFileSync(`/proc/${f[1]}/stat`, 'utf8').includes('(postgres)')) ticks += Number(f[13]) + Number(f[14]); // the postmaster: cutime, cstime
    } catch { /* the process ended */ }
  }
  return (ticks * 1e6) / 100;
}

interface Measured extends autocannon.Result { cpuUs: number; machineUs: number; postgresUs: number; clientUs: number }

/** One autocannon run with the CPU time per answered request: server, PostgreSQL, autocannon, machine. */
async function measured(child: ChildProcess, go: () => Promise<autocannon.Result>): Promise<Measured> {
  const [before, machine, postgres, client] = [await serverCpu(child), machineCpu(), postgresCpu(), process.cpuUsage()];
  const result = await go();
  const own = process.cpuUsage(client);
  const per = (us: number) => us / Math.max(1, result.requests.total);
  return { ...result, cpuUs: per(await serverCpu(child) - before), machineUs: per(machineCpu() - machine), postgresUs: per(postgresCpu() - postgres), clientUs: per(own.user + own.system) };
}

function ask(child: ChildProcess, message: string, answer: string): Promise<void> {
  return new Promise((resolve) => {
    const on = (m: unknown) => { if (m === answer) { child.off('message', on); resolve(); } };
    child.on('message', on);
    child.send(message);
  });
}

function startServer(second: boolean) {
  const child = fork(fileURLToPath(import.meta.url), [], { env: { ...process.env, PERF_ROLE: 'server', PERF_SECOND: second ? '1' : '0' }, execArgv: ['--import', 'tsx'] });
  const ready = new Promise<{ base: string; diagnoses: string[] }>((resolve, reject) => {
    child.once('message', (m) => resolve(m as { base: string; diagnoses: string[] }));
    child.once('exit', (code) => reject(new Error(`the server process stopped (${code})`)));
  });
  return { child, ready };
}

/** --cluster: a second server and HAProxy (scripts/lib.sh haproxy_config) in front of both. */
async function balance(first: { base: string; diagnoses: string[] }) {
  const second = startServer(true);
  const other = await second.ready;
  const port = 4400 + Math.floor(Math.random() * 500);
  const backends = [first.base, other.base].map((b) => new URL(b).port);
  const cfg = '.tmp/perf-haproxy.cfg';
  const haproxy = spawn('bash', ['-c', `source scripts/lib.sh && haproxy_config ${port} ${backends.join(' ')} > ${cfg} && exec haproxy -db -f ${cfg}`], { stdio: 'inherit' });
  const base = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 100 && !(await fetch(`${base}/api/health`).then((r) => r.ok, () => false)); i++) await new Promise((r) => setTimeout(r, 100));
  return { env: { base, diagnoses: first.diagnoses }, stop: () => { haproxy.kill('SIGTERM'); second.child.send('stop'); } };
}

async function main(): Promise<void> {
  const cluster = process.argv.includes('--cluster');
  const { child, ready } = startServer(false);
  const direct = await ready;
  const balanced = cluster ? await balance(direct) : null;
  const env = balanced?.env ?? direct;
  const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  try {
    // ten sign-ins at a time: fifty bcrypt hashes at once starve the servers' health checks
    const sessions: { cookie: string; csrf: string }[] = [];
    while (sessions.length < CONNECTIONS) sessions.push(...await Promise.all(Array.from({ length: 10 }, () => signIn(env.base))));
    const half = env.diagnoses.length / 2;
    // PERF_PROFILE=steps (or bare, floor, me): a CPU profile of the server over that run only,
    // written to .tmp/prof/<run>.cpuprofile
    const profiled = async <T>(name: string, go: () => Promise<T>): Promise<T> => {
      if (process.env.PERF_PROFILE !== name) return go();
      await ask(child, 'profile-start', 'profiling');
      const out = await go();
      await ask(child, `profile-stop:${name}`, 'profiled');
      return out;
    };
    // warm both paths (JIT, pools, the pinned-version cache) before measuring
    await run({ url: env.base, diagnoses: env.diagnoses.slice(half), bare: true });
    await run({ url: env.base, sessions, diagnoses: env.diagnoses.slice(half), bare: false });
    const bare = await profiled('bare', () => measured(child, () => run({ url: env.base, diagnoses: env.diagnoses.slice(0, half / 2), bare: true })));
    const steps = await profiled('steps', () => measured(child, () => run({ url: env.base, sessions, diagnoses: env.diagnoses.slice(half / 2, half), bare: false })));
    // What any signed-in shop request pays (session, user, membership, one small query), for scale.
    const floor = await profiled('floor', () => measured(child, () => run({ url: env.base, sessions, diagnoses: [], bare: false, floor: '/api/shop/meters' })));
    const me = await profiled('me', () => measured(child, () => run({ url: env.base, sessions, diagnoses: [], bare: false, floor: '/api/auth/me' })));
    const ratio = steps.requests.average / bare.requests.average;
    const { rows: [stored] } = await db.query<{ n: number; per: number }>(
      'SELECT count(*)::int AS n, count(DISTINCT diagnosis_id)::int AS per FROM diagnosis_steps WHERE diagnosis_id = ANY($1::uuid[])', [env.diagnoses.slice(half / 2, half)]);
    console.log(`\nBench steps, ${CONNECTIONS} connections, ${DURATION} s each (after a warm-up of each)${cluster ? ', through HAProxy to two app servers (CPU/req server: the first one only)' : ''}`);
    console.log(summary('bare', bare));
    console.log(summary('steps', steps));
    console.log(summary('floor', floor), '  (GET /api/shop/meters: session + sign-in lookups + one query)');
    console.log(summary('me', me), '  (GET /api/auth/me: session + sign-in lookup + memberships)');
    console.log(`ratio  ${(100 * ratio).toFixed(1)} % of the bare throughput; ${stored!.n} steps stored over ${stored!.per} diagnoses`);
    // Little's law: with every connection always waiting, mean latency = connections / throughput.
    const mean = (r: autocannon.Result) => ((1000 * CONNECTIONS) / r.requests.average).toFixed(0);
    console.log(`mean latency at ${CONNECTIONS} connections (Little's law): bare ${mean(bare)} ms, steps ${mean(steps)} ms; machine: ${cpus().length} CPUs shared by the server, PostgreSQL and autocannon`);
    const p99Ratio = steps.latency.p99 / Math.max(1, bare.latency.p99);
    console.log(`p99    steps ${steps.latency.p99} ms = ${p99Ratio.toFixed(2)} × the bare p99 (${bare.latency.p99} ms)`);
    const ok = ratio >= 0.5 && p99Ratio <= 2.5 && steps.errors === 0 && steps.non2xx === 0;
    console.log(ok ? 'targets met (≥ 50 %, p99 ≤ 2.5 × bare, no errors)' : 'TARGETS MISSED (≥ 50 %, p99 ≤ 2.5 × bare, no errors)');
    process.exitCode = ok ? 0 : 1;
  } finally {
    // The benchmark cluster is kept between runs (perf:debrief's seeded history lives there):
    // leave it as it was found.
    await db.query(`DELETE FROM diagnoses d USING procedures p, procedure_versions v
      WHERE d.procedure_version_id = v.id AND v.procedure_id = p.id AND p.slug = 'perf-loop'`);
    await db.query(`DELETE FROM procedure_versions v USING procedures p WHERE v.procedure_id = p.id AND p.slug = 'perf-loop'`);
    await db.query(`DELETE FROM procedures WHERE slug = 'perf-loop'`);
    await db.query('DROP TABLE IF EXISTS perf_bare_steps');
    await db.end();
    balanced?.stop();
    child.send('stop');
    await new Promise((r) => child.once('exit', r));
  }
}

if (process.env.PERF_ROLE === 'server') void serve();
else void main();
