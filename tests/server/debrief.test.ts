import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { QueryTypes } from 'sequelize';
import { startTestApp, signInAs, otherShopMember, expectEnvelope, type TestEnv, type Client } from './harness';
import { publishFixture } from './debrief.fixture';
import { seedHistory, seedHistoryIfEmpty } from '../../server/seeders/history';
import { lintProcedure } from '@shared/engine/lint';
import { findCheckChains } from '@shared/engine/advisor';
import { procedureDocumentSchema, type ProcedureDocument } from '@shared/schema';
import { loadPinnedVersion } from '../../server/services/bench.service';
import type { ProcedureWalk } from '@shared/engine/walk';
import { decideStep, type PathRow } from '../../server/services/diagnosis-decide';

let env: TestEnv;
let trainer: Client;
let lead: Client;
let tech: Client;
let ids: { procedureId: string; versionId: string };
let shopId: string;
let techId: string;

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- raw rows of the direct computation
const q = async (sql: string, bind: unknown[] = []): Promise<any[]> => env.runtime.deps.sequelize.query(sql, { bind, type: QueryTypes.SELECT });

beforeAll(async () => {
  env = await startTestApp();
  [{ id: shopId }] = (await q(`SELECT id FROM shops WHERE slug = 'larkspur-lane'`)) as [{ id: string }];
  [{ id: techId }] = (await q(`SELECT id FROM users WHERE email = 'tech@larkspur.test'`)) as [{ id: string }];
  ids = await publishFixture(env.runtime.deps, shopId);
  await seedHistory(env.runtime.deps, shopId, { diagnoses: 150, seed: 5, now: new Date('2026-11-30T12:00:00Z'), days: 120 });
  [trainer, lead, tech] = await Promise.all([signInAs(env.app, 'trainer'), signInAs(env.app, 'lead'), signInAs(env.app, 'tech')]);
});
afterAll(async () => { await env.close(); });

describe('the diagnoses table', () => {
  it('a trainer pages through every diagnosis of the shop, newest first, with the total of the filtered set', async () => {
    const res = await trainer.get('/api/debrief/diagnoses?pageSize=20&page=2').expect(200);
    expect(res.body.total).toBe(150);
    expect(res.body.rows).toHaveLength(20);
    const times = res.body.rows.map((r: { startedAt: string }) => r.startedAt);
    expect([...times].sort().reverse()).toEqual(times);
    const mine = await trainer.get(`/api/debrief/diagnoses?procedureId=${ids.procedureId}&pageSize=200`).expect(200);
    const [{ n }] = await q(`SELECT count(*)::int AS n FROM diagnoses WHERE procedure_version_id = $1`, [ids.versionId]);
    expect(mine.body.total).toBe(n);
    expect(mine.body.rows.every((r: { procedureTitle: string; versionNumber: number }) => r.procedureTitle === 'Debrief fixture: no spark' && r.versionNumber === 1)).toBe(true);
  });

  it('filters by status and flag and sorts by duration on the server', async () => {
    const res = await trainer.get('/api/debrief/diagnoses?status=finished&sort=duration&dir=asc&pageSize=200').expect(200);
    const [{ n }] = await q(`SELECT count(*)::int AS n FROM diagnoses WHERE status = 'finished'`);
    expect(res.body.total).toBe(n);
    const durations = res.body.rows.map((r: { durationSeconds: number }) => r.durationSeconds);
    expect([...durations].sort((a, b) => a - b)).toEqual(durations);
    const back = await trainer.get('/api/debrief/diagnoses?flag=taken-back&pageSize=200').expect(200);
    const [{ m }] = await q(`SELECT count(DISTINCT diagnosis_id)::int AS m FROM diagnosis_steps WHERE superseded`);
    expect(back.body.total).toBe(m);
    expect(back.body.rows.every((r: { flags: { takenBack: boolean } }) => r.flags.takenBack)).toBe(true);
  });

  it('the borderline and comeback filters count what the rows say, page by page', async () => {
    const border = await trainer.get('/api/debrief/diagnoses?flag=borderline&pageSize=200').expect(200);
    const [{ b }] = await q(`SELECT count(DISTINCT diagnosis_id)::int AS b FROM diagnosis_steps WHERE verdict IN ('borderline-low', 'borderline-high')`);
    expect(b).toBeGreaterThan(0);
    expect(border.body.total).toBe(b);
    expect(border.body.rows.every((r: { flags: { borderline: boolean } }) => r.flags.borderline)).toBe(true);
    const back = await trainer.get('/api/debrief/diagnoses?flag=comeback&pageSize=5&page=1').expect(200);
    const [{ c }] = await q(`SELECT count(*)::int AS c FROM diagnoses d WHERE d.status <> 'active' AND EXISTS (
      SELECT 1 FROM diagnoses x WHERE x.vehicle_id = d.vehicle_id AND x.started_at > COALESCE(d.ended_at, d.last_activity_at)
         AND x.started_at <= COALESCE(d.ended_at, d.last_activity_at) + make_interval(days => $1::int))`, [back.body.comebackDays]);
    expect(c).toBeGreaterThan(5); // the fixture has comebacks on more than one page
    expect(back.body.total).toBe(c);
    expect(back.body.rows).toHaveLength(5);
    expect(back.body.rows.every((r: { flags: { comeback: boolean } }) => r.flags.comeback)).toBe(true);
  });

  it('filters by technician, and lists the shop technicians for the filter', async () => {
    const list = await trainer.get('/api/debrief/technicians').expect(200);
    expect(list.body).toEqual(expect.arrayContaining([{ id: techId, name: 'Casey Tech' }]));
    const res = await trainer.get(`/api/debrief/diagnoses?technicianId=${techId}&pageSize=200`).expect(200);
    const [{ n }] = await q(`SELECT count(*)::int AS n FROM diagnoses WHERE technician_id = $1`, [techId]);
    expect(res.body.total).toBe(n);
    await tech.get('/api/debrief/technicians').expect(403);
  });

  it('exports the filtered set as CSV with a header and one line per diagnosis', async () => {
    const res = await trainer.get('/api/debrief/diagnoses.csv?status=abandoned').expect(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const lines = res.text.trim().split('\r\n');
    const [{ n }] = await q(`SELECT count(*)::int AS n FROM diagnoses WHERE status = 'abandoned'`);
    expect(lines[0]).toMatch(/^id,procedure,version,vehicle/);
    expect(lines).toHaveLength(n + 1);
  });

  it('a bad filter gets a 400 that names the field', async () => {
    const res = await trainer.get('/api/debrief/diagnoses?status=lost').expect(400);
    expect(expectEnvelope(res.body).issues?.[0]?.path).toBe('status');
  });
});

describe('who sees what', () => {
  it('a technician sees only their own diagnoses', async () => {
    const res = await tech.get('/api/debrief/diagnoses?pageSize=200').expect(200);
    const [{ n }] = await q(`SELECT count(*)::int AS n FROM diagnoses WHERE technician_id = $1`, [techId]);
    expect(n).toBeGreaterThan(0);
    expect(res.body.total).toBe(n);
    expect(res.body.rows.every((r: { technicianId: string }) => r.technicianId === techId)).toBe(true);
  });

  it("a technician gets 404 for a colleague's diagnosis and 403 for the analytics", async () => {
    const [other] = await q(`SELECT id FROM diagnoses WHERE technician_id <> $1 LIMIT 1`, [techId]);
    expect(expectEnvelope((await tech.get(`/api/debrief/diagnoses/${other!.id}`).expect(404)).body).code).toBe('not_found');
    await tech.get(`/api/debrief/analytics/steps?procedureId=${ids.procedureId}`).expect(403);
  });

  // Changed with the one permission policy: authors work on the Bench, so like technicians they
  // read their own diagnoses here (none in this history); a member with no diagnosis role is refused.
  it('an author without a Debrief role sees only their own diagnoses, and an admin is refused the table', async () => {
    const author = await signInAs(env.app, 'author');
    const res = await author.get('/api/debrief/diagnoses').expect(200);
    expect(res.body.total).toBe(0);
    const admin = await signInAs(env.app, 'admin');
    expect(expectEnvelope((await admin.get('/api/debrief/diagnoses').expect(403)).body).code).toBe('forbidden');
  });

  it('a trainer of another shop gets 404 for this shop\'s diagnosis and procedure, and sees none of its rows', async () => {
    const outsider = await otherShopMember(env, ['trainer', 'lead']);
    const [d] = await q(`SELECT id FROM diagnoses LIMIT 1`);
    await outsider.get(`/api/debrief/diagnoses/${d!.id}`).expect(404);
    await outsider.get(`/api/debrief/analytics/steps?procedureId=${ids.procedureId}`).expect(404);
    await outsider.post(`/api/debrief/diagnoses/${d!.id}/coaching-notes`, { body: 'Nice work' }).expect(404);
    await outsider.post('/api/debrief/advisor/drafts', { versionId: ids.versionId, order: ['a', 'b'] }).expect(404);
    expect((await outsider.get('/api/debrief/diagnoses').expect(200)).body.total).toBe(0);
  });
});

describe('replaying a diagnosis and coaching', () => {
  it('the replay has the timeline with superseded answers, the path without them, and the document', async () => {
    const [d] = await q(`SELECT s.diagnosis_id AS id, v.document->>'start' AS start FROM diagnosis_steps s
      JOIN diagnoses d ON d.id = s.diagnosis_id JOIN procedure_versions v ON v.id = d.procedure_version_id WHERE s.superseded LIMIT 1`);
    const res = await trainer.get(`/api/debrief/diagnoses/${d!.id}`).expect(200);
    const rows = await q(`SELECT step_id, superseded FROM diagnosis_steps WHERE diagnosis_id = $1 ORDER BY seq`, [d!.id]);
    expect(res.body.steps.map((s: { stepId: string }) => s.stepId)).toEqual(rows.map((r) => r.step_id));
    expect(res.body.steps.some((s: { superseded: boolean }) => s.superseded)).toBe(true);
    const onPath = rows.filter((r) => !r.superseded).map((r) => r.step_id);
    const [{ ending }] = await q(`SELECT ending_step_id AS ending FROM diagnoses WHERE id = $1`, [d!.id]);
    expect(res.body.path).toEqual(ending && onPath[onPath.length - 1] !== ending ? [...onPath, ending] : onPath);
    expect(res.body.document.start).toBe(d!.start);
    expect(res.body.diagnosis.flags.takenBack).toBe(true);
  });

  it('a trainer adds a note on a step; the technician who ran the diagnosis reads it', async () => {
    const [d] = await q(`SELECT id FROM diagnoses WHERE technician_id = $1 AND status = 'finished' AND procedure_version_id = $2 LIMIT 1`, [techId, ids.versionId]);
    const note = await trainer.post(`/api/debrief/diagnoses/${d!.id}/coaching-notes`, { body: 'Null the leads before the primary reading.', stepId: 'coilPrimary' }).expect(201);
    expect(note.body).toMatchObject({ stepId: 'coilPrimary', authorName: 'Jordan Trainer' });
    await lead.post(`/api/debrief/diagnoses/${d!.id}/coaching-notes`, { body: 'Good finding.' }).expect(201);
    const seen = await tech.get(`/api/debrief/diagnoses/${d!.id}`).expect(200);
    expect(seen.body.notes.map((n: { body: string; stepId: string | null }) => [n.stepId, n.body])).toEqual([
      ['coilPrimary', 'Null the leads before the primary reading.'], [null, 'Good finding.'],
    ]);
  });

  it('a technician cannot write coaching notes, an empty note or an unknown step gets 400, nothing is stored', async () => {
    const [d] = await q(`SELECT id FROM diagnoses WHERE technician_id = $1 LIMIT 1`, [techId]);
    const [{ before }] = await q(`SELECT count(*)::int AS before FROM coaching_notes`);
    await tech.post(`/api/debrief/diagnoses/${d!.id}/coaching-notes`, { body: 'Self praise' }).expect(403);
    expect(expectEnvelope((await trainer.post(`/api/debrief/diagnoses/${d!.id}/coaching-notes`, { body: '  ' }).expect(400)).body).issues?.[0]?.path).toBe('body');
    expect(expectEnvelope((await trainer.post(`/api/debrief/diagnoses/${d!.id}/coaching-notes`, { body: 'x', stepId: 'nowhere' }).expect(400)).body).issues?.[0]?.path).toBe('stepId');
    const [{ after }] = await q(`SELECT count(*)::int AS after FROM coaching_notes`);
    expect(after).toBe(before);
  });
});

describe('turning the advisor proposal into a draft', () => {
  it('a lead makes a draft with the chain reordered; it passes the soundness check and points at the version', async () => {
    const advice = await lead.get(`/api/debrief/analytics/advisor?procedureId=${ids.procedureId}&versionId=${ids.versionId}`).expect(200);
    const order = ['pulserGap', 'exciter', 'killSwitch', 'coilPrimary'];
    expect([...advice.body.chains[0].checks].sort()).toEqual([...order].sort());
    await trainer.post('/api/debrief/advisor/drafts', { versionId: ids.versionId, order }).expect(403);
    const res = await lead.post('/api/debrief/advisor/drafts', { versionId: ids.versionId, order }).expect(201);
    const [draft] = await q(`SELECT * FROM procedure_versions WHERE id = $1`, [res.body.draftId]);
    expect(draft).toMatchObject({ status: 'draft', based_on_id: ids.versionId, number: null });
    const doc = procedureDocumentSchema.parse(draft!.document);
    expect(lintProcedure(doc).errorCount).toBe(0);
    expect(findCheckChains(doc)[0]!.checks).toEqual(order);
  });

  it('a second draft while one is open answers 409 with a message that says what to do', async () => {
    const res = await lead.post('/api/debrief/advisor/drafts', { versionId: ids.versionId, order: ['exciter', 'killSwitch', 'coilPrimary', 'pulserGap'] }).expect(409);
    expect(expectEnvelope(res.body).message).toMatch(/already has an open draft.*Drafting/);
    const [{ n }] = await q(`SELECT count(*)::int AS n FROM procedure_versions WHERE procedure_id = $1 AND status = 'draft'`, [ids.procedureId]);
    expect(n).toBe(1);
  });

  it('an order that is not a chain of the version gets 400', async () => {
    await q(`DELETE FROM procedure_versions WHERE procedure_id = $1 AND status = 'draft'`, [ids.procedureId]);
    await lead.post('/api/debrief/advisor/drafts', { versionId: ids.versionId, order: ['exciter', 'prepare'] }).expect(400);
  });
});

describe('the demo history is what Bench writes', () => {
  // Debrief's tests run on the seeded history, so each of its rows must be what the step endpoint
  // stores for the same answers: replaying every path through the endpoint's decideStep gives the
  // same verdict, branch, value, next step and route.
  it('every answered step of every seeded diagnosis replays through the live decision to the row stored', async () => {
    const rows = await q(`SELECT s.diagnosis_id, s.step_id, s.entered, s.answer_id, s.value, s.unit, s.verdict, s.band_id, s.next_step_id, s.shown, d.procedure_version_id
      FROM diagnosis_steps s JOIN diagnoses d ON d.id = s.diagnosis_id
      WHERE s.shop_id = $1 AND NOT s.superseded ORDER BY s.diagnosis_id, s.seq`, [shopId]);
    // The endpoint walks the version joined with the versions its links continue in; so does the replay.
    const docs = new Map<string, ProcedureDocument>();
    for (const r of rows) if (!docs.has(r.procedure_version_id)) docs.set(r.procedure_version_id, (await loadPinnedVersion(env.runtime.deps.sequelize, shopId, r.procedure_version_id)).document);
    expect(rows.length).toBeGreaterThan(500);
    let walk: ProcedureWalk | undefined;
    let keep: PathRow[] = [];
    const mismatches: string[] = [];
    rows.forEach((r, i) => {
      if (i === 0 || rows[i - 1].diagnosis_id !== r.diagnosis_id) { walk = undefined; keep = []; }
      const doc = docs.get(r.procedure_version_id)!;
      const answer = { stepId: r.step_id, entered: r.entered ?? undefined, answerId: r.answer_id ?? undefined, acknowledged: r.shown.acknowledged === true };
      const out = decideStep(doc, new Map(doc.steps.map((st) => [st.id, st])), keep, answer, walk);
      const d = out.decided;
      const want = [d.verdict, d.bandId, d.next, d.unit, d.value === null ? null : Number(d.value.toPrecision(9)), (d.shown as { route?: string }).route ?? null];
      const got = [r.verdict, r.band_id, r.next_step_id, r.unit, r.value === null ? null : Number(Number(r.value).toPrecision(9)), r.shown.route ?? null];
      if (JSON.stringify(want) !== JSON.stringify(got)) mismatches.push(`${r.step_id}: stored ${JSON.stringify(got)}, decided ${JSON.stringify(want)}`);
      walk = out.walk;
      keep = [...keep, { id: String(i), seq: keep.length + 1, stepId: r.step_id, next: d.next, entered: d.entered, lead: null, answerId: d.answerId, acknowledged: answer.acknowledged }];
    });
    expect(mismatches.slice(0, 5)).toEqual([]);
    // and the history does reach the branches Debrief counts: a borderline plug cap on the demo weak-spark procedure
    expect(rows.some((r) => r.step_id === 'capOhms' && r.band_id === 'borderline')).toBe(true);
  });
});

describe('the demo history at start-up', () => {
  it('seeds only when the shop has no diagnoses yet', async () => {
    expect(await seedHistoryIfEmpty(env.runtime.deps, shopId, 50)).toBe(0);
    const [{ sister }] = await q(`SELECT id AS sister FROM shops WHERE slug = 'larkspur-harbour'`);
    expect(await seedHistoryIfEmpty(env.runtime.deps, sister, 50)).toBe(0); // no published procedure there
  });
});
