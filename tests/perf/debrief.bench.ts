// npm run perf:debrief: seeds 100 000 invented diagnoses (about a million steps) into a throwaway
// database and times each Debrief analytics endpoint (median of 5 runs; budget 500 ms each).
import { QueryTypes } from 'sequelize';
import { loadConfig } from '../../server/config';
import { startRuntime } from '../../server/runtime';
import { createApp } from '../../server/app';
import { seedDemo } from '../../server/seeders/demo';
import { seedHistory } from '../../server/seeders/history';
import { publishFixture } from '../server/debrief.fixture';
import { Client, DEMO_PASSWORD } from '../server/harness';
import { hashPassword } from '../../server/lib/passwords';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

const N = Number(process.env.DEBRIEF_BENCH_DIAGNOSES ?? 100_000);
const BUDGET_MS = 500;
const PASSWORD = DEMO_PASSWORD;

const config = loadConfig({
  ...process.env, NODE_ENV: 'test', PORT: '0', SMTP_PORT: '0', DEMO_PASSWORD: PASSWORD, SERVE_CLIENT: '0', LOCAL_FAKES: '1',
  DATA_DIR: mkdtempSync(path.join(tmpdir(), 'sw-bench-')), LOGIN_RATE_LIMIT: '1000',
});
const runtime = await startRuntime(config);
const { sequelize } = runtime.deps;
const q = <T extends object>(sql: string, bind: unknown[] = []) => sequelize.query<T>(sql, { bind, type: QueryTypes.SELECT });
let failed = false;
try {
  await seedDemo(runtime.deps);
  const [shop] = await q<{ id: string }>(`SELECT id FROM shops WHERE slug = 'larkspur-lane'`);
  const [existing] = await q<{ n: number }>(`SELECT count(*)::int AS n FROM diagnoses WHERE shop_id = $1`, [shop!.id]);
  if (existing!.n < N) {
    const [fx] = await q<{ id: string }>(`SELECT id FROM procedures WHERE shop_id = $1 AND slug = 'debrief-fixture'`, [shop!.id]);
    if (!fx) await publishFixture(runtime.deps, shop!.id);
    const t0 = Date.now();
    const r = await seedHistory(runtime.deps, shop!.id, { diagnoses: N - existing!.n, seed: 99, log: (m) => { if (/0000 \//.test(m)) console.log(m); } });
    console.log(`seeded ${r.diagnoses} diagnoses, ${r.steps} steps in ${((Date.now() - t0) / 1000).toFixed(1)} s`);
  }
  await sequelize.query('VACUUM ANALYZE diagnoses');
  await sequelize.query('VACUUM ANALYZE diagnosis_steps');
  const [counts] = await q<{ d: number; s: number }>(`SELECT (SELECT count(*)::int FROM diagnoses) AS d, (SELECT count(*)::int FROM diagnosis_steps) AS s`);
  console.log(`rows: ${counts!.d} diagnoses, ${counts!.s} diagnosis steps`);

  // A trainer of its own, so the benchmark signs in whatever password the shared perf database holds.
  const email = 'bench-trainer@larkspur.test';
  const [user] = await q<{ id: string }>(`INSERT INTO users (email, name, password_hash) VALUES ($1, 'Bench Trainer', $2)
    ON CONFLICT (email) DO UPDATE SET password_hash = EXCLUDED.password_hash RETURNING id`, [email, await hashPassword(PASSWORD)]);
  await q(`INSERT INTO memberships (shop_id, user_id, roles) VALUES ($1, $2, ARRAY['trainer']) ON CONFLICT DO NOTHING RETURNING id`, [shop!.id, user!.id]);
  const app = createApp(runtime.deps);
  const trainer = new Client(app);
  const login = await trainer.signIn(email, PASSWORD);
  if (login.status !== 200) throw new Error(`sign-in failed: ${login.status}`);
  // The demo "No spark" procedure (the largest of the seeded history); else the one with most steps.
  const procs = await q<{ id: string; title: string; n: number; steps: number }>(`SELECT p.id, p.title, count(DISTINCT d.id)::int AS n,
      (SELECT count(*)::int FROM diagnosis_steps s WHERE s.shop_id = $1 AND s.dx_version_id = ANY(array_agg(DISTINCT v.id))) AS steps
    FROM procedures p JOIN procedure_versions v ON v.procedure_id = p.id JOIN diagnoses d ON d.procedure_version_id = v.id
    WHERE p.shop_id = $1 GROUP BY 1, 2 ORDER BY (p.slug = 'no-spark') DESC, steps DESC LIMIT 1`, [shop!.id]);
  const proc = procs[0]!;
  console.log(`procedure "${proc.title}": ${proc.n} diagnoses and ${proc.steps} steps in scope`);
  const endpoints = ['steps', 'findings', 'readings', 'times', 'advisor'].map((w) => `/api/debrief/analytics/${w}?procedureId=${proc.id}`);
  endpoints.push('/api/debrief/diagnoses?pageSize=25', '/api/debrief/diagnoses?flag=comeback&sort=duration&pageSize=25');
  for (const url of endpoints) {
    const times: number[] = [];
    let size = 0;
    for (let i = 0; i < 6; i++) {
      const t0 = performance.now();
      const res = await trainer.get(url);
      const ms = performance.now() - t0;
      if (res.status !== 200) throw new Error(`${url}: ${res.status} ${JSON.stringify(res.body)}`);
      size = res.text.length;
      if (i > 0) times.push(ms); // the first run warms the caches
    }
    times.sort((a, b) => a - b);
    const median = times[2]!;
    const analytics = url.includes('/analytics/');
    const over = analytics && median > BUDGET_MS;
    if (over) failed = true;
    console.log(`${over ? 'OVER ' : ''}${median.toFixed(0).padStart(5)} ms median of 5  ${(size / 1024).toFixed(1).padStart(7)} kB  ${url.replace(proc.id, '<id>')}`);
  }
} finally {
  await runtime.close();
}
if (failed) {
  console.log(`some analytics endpoint took more than ${BUDGET_MS} ms`);
  process.exitCode = 1;
}
