import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { QueryTypes } from 'sequelize';
import { startTestApp, signInAs, type TestEnv, type Client } from './harness';
import { publishFixture, fixtureDoc } from './debrief.fixture';
import { seedHistory } from '../../server/seeders/history';
import { quartiles } from '@shared/stats/quantile';
import { branchesOf } from '@shared/engine/kinds';
import { expectedChainSeconds, orderByRatio } from '@shared/engine/advisor';

// Every figure of the analytics endpoints (computed in SQL) is checked against a direct
// computation in JavaScript over the raw rows of a small seeded history.
let env: TestEnv;
let trainer: Client;
let ids: { procedureId: string; versionId: string };
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- raw rows of the direct computation
let diagnoses: any[];
// eslint-disable-next-line @typescript-eslint/no-explicit-any
let steps: any[];
let shopId: string;

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- raw rows of the direct computation
const q = async (sql: string, bind: unknown[] = []): Promise<any[]> => env.runtime.deps.sequelize.query(sql, { bind, type: QueryTypes.SELECT });

beforeAll(async () => {
  env = await startTestApp();
  [{ id: shopId }] = (await q(`SELECT id FROM shops WHERE slug = 'larkspur-lane'`)) as [{ id: string }];
  ids = await publishFixture(env.runtime.deps, shopId);
  await seedHistory(env.runtime.deps, shopId, { diagnoses: 240, seed: 11, now: new Date('2026-11-30T12:00:00Z'), days: 200 });
  diagnoses = await q(`SELECT * FROM diagnoses WHERE procedure_version_id = $1`, [ids.versionId]);
  steps = await q(`SELECT s.* FROM diagnosis_steps s JOIN diagnoses d ON d.id = s.diagnosis_id WHERE d.procedure_version_id = $1`, [ids.versionId]);
  trainer = await signInAs(env.app, 'trainer');
});
afterAll(async () => { await env.close(); });

const url = (what: string, extra = '') => `/api/debrief/analytics/${what}?procedureId=${ids.procedureId}${extra}`;
const onPath = () => steps.filter((s) => !s.superseded);
const secs = (a: Date, b: Date) => (new Date(b).getTime() - new Date(a).getTime()) / 1000;

describe('Debrief analytics against a direct computation on a small seeded history', () => {
  it('the seeded history has every status, borderline readings and steps taken back to check against', () => {
    const statuses = new Set(diagnoses.map((d) => d.status));
    expect([...statuses].sort()).toEqual(expect.arrayContaining(['abandoned', 'finished', 'handed_off']));
    expect(steps.some((s) => s.superseded)).toBe(true);
    expect(steps.some((s) => String(s.verdict).startsWith('borderline'))).toBe(true);
  });

  it('reached and ended counts per step equal the counts over the raw rows', async () => {
    const res = await trainer.get(url('steps')).expect(200);
    expect(res.body.diagnoses).toBe(diagnoses.length);
    for (const stepId of fixtureDoc().steps.map((s) => s.id)) {
      const reached = new Set([
        ...onPath().filter((s) => s.step_id === stepId).map((s) => s.diagnosis_id),
        ...diagnoses.filter((d) => d.ending_step_id === stepId).map((d) => d.id),
      ]).size;
      const ended = (status: string) => diagnoses.filter((d) => d.ending_step_id === stepId && d.status === status).length;
      const fig = res.body.steps.find((f: { stepId: string }) => f.stepId === stepId) ?? { reached: 0, finished: 0, handedOff: 0, abandoned: 0 };
      expect({ stepId, reached: fig.reached, finished: fig.finished, handedOff: fig.handedOff, abandoned: fig.abandoned })
        .toEqual({ stepId, reached, finished: ended('finished'), handedOff: ended('handed_off'), abandoned: ended('abandoned') });
    }
  });

  it('branch shares per step add up to 1 and match the answers recorded on the path', async () => {
    const res = await trainer.get(url('steps')).expect(200);
    const doc = fixtureDoc();
    for (const step of doc.steps) {
      const answered = onPath().filter((s) => s.step_id === step.id);
      for (const b of branchesOf(step)) {
        const took = answered.filter((s) => (s.answer_id ? `answer:${s.answer_id}` : s.band_id ? `band:${s.band_id}` : 'next') === b.handle).length;
        const fig = res.body.branches.find((x: { from: string; handle: string }) => x.from === step.id && x.handle === b.handle);
        expect(fig?.count ?? 0).toBe(took);
        if (took) expect(fig.share).toBeCloseTo(took / answered.length, 12);
      }
    }
  });

  it('ending shares and the first-time-fix rate follow from the rows and the shop comeback days (30)', async () => {
    const res = await trainer.get(url('findings')).expect(200);
    const ended = diagnoses.filter((d) => d.status !== 'active' && d.ending_step_id);
    expect(res.body.ended).toBe(ended.length);
    const top = res.body.endings[0];
    expect(top.count).toBe(ended.filter((d) => d.ending_step_id === top.stepId && d.status === top.status).length);
    expect(res.body.endings.reduce((a: number, e: { share: number }) => a + e.share, 0)).toBeCloseTo(1, 12);
    const all = await q(`SELECT * FROM diagnoses WHERE shop_id = $1`, [shopId]);
    const finished = diagnoses.filter((d) => d.status === 'finished');
    const day = 86_400_000;
    const cameBack = finished.filter((d) => all.some((c) => c.vehicle_id === d.vehicle_id
      && new Date(c.started_at).getTime() > new Date(d.ended_at).getTime()
      && new Date(c.started_at).getTime() <= new Date(d.ended_at).getTime() + 30 * day));
    expect(cameBack.length).toBeGreaterThan(0);
    expect(res.body.firstTimeFix).toEqual({
      finished: finished.length, comebacks: cameBack.length, comebackDays: 30, rate: (finished.length - cameBack.length) / finished.length,
    });
  });

  it('time quartiles per step and per diagnosis are type 7 quantiles (Hyndman & Fan 1996) of the raw durations', async () => {
    const res = await trainer.get(url('times')).expect(200);
    expect(res.body.definition).toMatch(/type 7/);
    for (const f of res.body.steps) {
      const expected = quartiles(onPath().filter((s) => s.step_id === f.stepId).map((s) => secs(s.started_at, s.answered_at)));
      expect(f.n).toBe(expected.n);
      expect(f.q1).toBeCloseTo(expected.q1, 6);
      expect(f.median).toBeCloseTo(expected.median, 6);
      expect(f.q3).toBeCloseTo(expected.q3, 6);
    }
    const whole = quartiles(diagnoses.filter((d) => ['finished', 'handed_off'].includes(d.status)).map((d) => secs(d.started_at, d.ended_at)));
    expect(res.body.diagnosis.n).toBe(whole.n);
    expect(res.body.diagnosis.median).toBeCloseTo(whole.median, 6);
    expect(res.body.diagnosis.q3).toBeCloseTo(whole.q3, 6);
  });

  it('reading histograms hold every recorded value once, with the borderline share and per-technician medians', async () => {
    const res = await trainer.get(url('readings')).expect(200);
    const coil = res.body.readings.find((r: { stepId: string }) => r.stepId === 'coilPrimary');
    const values = onPath().filter((s) => s.step_id === 'coilPrimary' && s.value !== null);
    expect(coil.n).toBe(values.length);
    expect(coil.bins.reduce((a: number, b: { count: number }) => a + b.count, 0)).toBe(values.length);
    expect(coil.limits).toEqual({ min: 0.2, max: 1.0 });
    expect(coil.bins[0].lo).toBeLessThanOrEqual(0.2);
    expect(coil.bins[coil.bins.length - 1].hi).toBeGreaterThanOrEqual(1.0);
    for (const bin of coil.bins) {
      const inBin = values.filter((s) => s.value >= bin.lo && (s.value < bin.hi || bin === coil.bins[coil.bins.length - 1])).length;
      expect(bin.count).toBe(inBin);
    }
    const borderline = values.filter((s) => String(s.verdict).startsWith('borderline')).length;
    expect(coil.borderline).toBe(borderline);
    for (const t of coil.byTechnician) {
      const mine = values.filter((s) => diagnoses.find((d) => d.id === s.diagnosis_id)!.technician_id === t.technicianId).map((s) => s.value);
      expect(t.n).toBe(mine.length);
      expect(t.median).toBeCloseTo(quartiles(mine).median, 9);
    }
  });

  it('a date range keeps only diagnoses started on those days (to inclusive)', async () => {
    const res = await trainer.get(url('steps', '&from=2026-10-01&to=2026-10-31')).expect(200);
    const inRange = diagnoses.filter((d) => d.started_at >= new Date('2026-10-01T00:00:00Z') && d.started_at < new Date('2026-11-01T00:00:00Z'));
    expect(res.body.diagnoses).toBe(inRange.length);
    expect(inRange.length).toBeLessThan(diagnoses.length);
  });

  it('the advisor estimates each check from the rows and its expected times follow the p/c order', async () => {
    const res = await trainer.get(url('advisor', `&versionId=${ids.versionId}`)).expect(200);
    const [chain] = res.body.chains;
    expect(chain.checks).toEqual(['killSwitch', 'coilPrimary', 'exciter', 'pulserGap']);
    const ended = new Set(diagnoses.filter((d) => ['finished', 'handed_off'].includes(d.status)).map((d) => d.id));
    const rows = onPath().filter((s) => ended.has(s.diagnosis_id));
    const entered = rows.filter((s) => s.step_id === 'killSwitch').length;
    expect(chain.entered).toBe(entered);
    const revealedAt: Record<string, number> = {
      killSwitch: rows.filter((s) => s.step_id === 'killSwitch' && s.answer_id === 'returns').length,
      coilPrimary: rows.filter((s) => s.step_id === 'coilPrimary' && ['low', 'high'].includes(s.band_id)).length,
      exciter: rows.filter((s) => s.step_id === 'exciter' && s.band_id === 'low').length,
      pulserGap: rows.filter((s) => s.step_id === 'pulserGap' && s.answer_id === 'wide').length,
    };
    for (const c of chain.current) {
      expect(c.revealed).toBe(revealedAt[c.stepId]);
      expect(c.revealShare).toBeCloseTo(revealedAt[c.stepId]! / entered, 12);
      const times = rows.filter((s) => s.step_id === c.stepId).map((s) => secs(s.started_at, s.answered_at));
      expect(c.seconds).toBeCloseTo(quartiles(times).median, 6);
    }
    expect(chain.proposed.map((c: { stepId: string }) => c.stepId)).toEqual(orderByRatio(chain.current).map((c) => c.stepId));
    expect(chain.currentSeconds).toBeCloseTo(expectedChainSeconds(chain.current), 6);
    expect(chain.proposedSeconds).toBeLessThanOrEqual(chain.currentSeconds + 1e-9);
  });
});

describe('the analytics are aggregated in the database', () => {
  it('each analytics endpoint sends at most four statements and gets back figures, not rows (query-count budget)', async () => {
    const seen: string[] = [];
    const hook = (options: { type?: string }, query: { sql?: string }) => { seen.push(String(query.sql ?? options.type)); };
    env.runtime.deps.sequelize.addHook('afterQuery', 'count-debrief', hook as never);
    try {
      for (const what of ['steps', 'findings', 'readings', 'times', 'advisor']) {
        seen.length = 0;
        const res = await trainer.get(url(what)).expect(200);
        const mine = seen.filter((sql) => !/FROM "(memberships|users)"/.test(sql)); // sign-in context, not Debrief
        expect(mine.length).toBeGreaterThan(1);
        expect({ what, statements: mine.length <= 4 ? "within budget" : mine }).toEqual({ what, statements: "within budget" });
        // No statement reads step rows out to Node: every one that touches diagnosis_steps aggregates.
        for (const sql of mine.filter((x) => /diagnosis_steps/.test(x))) expect(sql).toMatch(/count\(|percentile_cont|json_agg/);
        expect(JSON.stringify(res.body).length).toBeLessThan(60_000);
      }
    } finally {
      env.runtime.deps.sequelize.removeHook('afterQuery', 'count-debrief');
    }
  });
});

