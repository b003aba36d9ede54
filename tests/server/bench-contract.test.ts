import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import {
  BenchProcedure, BenchVersion, DiagnosisRecord, DiagnosisSummary, StartDiagnosisResult, StepResult,
  type DiagnosisStepBody,
} from '@shared/schema/bench';
import { stepView } from '@shared/engine/step-view';
import { enteredOf } from '@shared/engine/step-entry';
import { walkRows } from '../../src/features/bench/lib/walk-rows';
import type { LocalRow } from '../../src/lib/offline/db';
import { benchDoc, benchSuite, startBody, stepBody } from './bench-fixtures';

// The Bench contract (shared/schema/bench.ts) against the real API on PostgreSQL: every answer the
// phone reads is parsed with the shared answer schema, and what the phone sends is typed with the
// shared input types, so a field the server renames or drops fails here and in the type check.

const suite = benchSuite();

/** The answer parsed with the shared schema; a mismatch names the field that differs. */
function parsed<S extends z.ZodType>(schema: S, body: unknown): z.infer<S> {
  const r = schema.safeParse(body);
  expect(r.success, r.success ? '' : JSON.stringify(r.error.issues, null, 1)).toBe(true);
  return r.data as z.infer<S>;
}

async function walkToFinding(): Promise<{ id: string; sent: LocalRow[] }> {
  const start = startBody(suite.world);
  parsed(StartDiagnosisResult, (await suite.tech.post('/api/diagnoses', start).expect(201)).body);
  const answers: [string, Partial<DiagnosisStepBody>][] = [
    ['killLead', {}], ['sparkTest', { answerId: 'none' }], ['exciter', { entered: '0,15k' }],
    ['pulser', { entered: '120', leadEntered: '0.4', acknowledged: true }], ['combined', {}],
    ['cdiFinding', { outcome: { partsFitted: [{ name: 'CDI unit', lot: 'L2611' }], finalCheck: { spark: true, runs: true, stops: true }, labourMinutes: 35 } }],
  ];
  const sent: LocalRow[] = [];
  for (const [stepId, extra] of answers) {
    const body = { note: '', ...stepBody(stepId, sent.at(-1)?.id ?? null, extra) } as LocalRow;
    const res = await suite.tech.post(`/api/diagnoses/${start.id}/steps`, body).expect(201);
    const result = parsed(StepResult, res.body);
    expect(result).toMatchObject({ id: body.id, stepId, duplicate: false });
    sent.push(body);
  }
  return { id: start.id, sent };
}

describe('the Bench contract in shared/', () => {
  it('the published list and the pinned version parse with the shared answer schemas', async () => {
    const list = parsed(BenchProcedure.array(), (await suite.tech.get('/api/bench/procedures').expect(200)).body);
    const mine = list.find((p) => p.slug === 'bench-test')!;
    expect(mine.versionId).toBe(suite.world.versionId);
    const bySlug = parsed(BenchVersion, (await suite.tech.get('/api/bench/procedures/bench-test').expect(200)).body);
    const byId = parsed(BenchVersion, (await suite.tech.get(`/api/bench/versions/${suite.world.versionId}`).expect(200)).body);
    expect(bySlug).toEqual(byId);
    expect(byId.document.start).toBe(benchDoc.start);
  });

  it('start, each step, a step sent again, the list and the record parse with the shared schemas', async () => {
    const { id, sent } = await walkToFinding();
    const again = await suite.tech.post(`/api/diagnoses/${id}/steps`, sent[2]).expect(200);
    expect(parsed(StepResult, again.body)).toMatchObject({ id: sent[2]!.id, duplicate: true, verdict: 'within', status: 'finished' });
    const list = parsed(DiagnosisSummary.array(), (await suite.tech.get('/api/diagnoses?status=finished').expect(200)).body);
    expect(list.find((d) => d.id === id)).toMatchObject({ status: 'finished', stepsAnswered: 6, endingStepId: 'cdiFinding' });
    const record = parsed(DiagnosisRecord, (await suite.tech.get(`/api/diagnoses/${id}`).expect(200)).body);
    expect(record.steps.map((s) => s.stepId)).toEqual(sent.map((s) => s.stepId));
    expect(record.outcome).toMatchObject({ labourMinutes: 35 });
    expect(record.meterEntries.length).toBeGreaterThan(0);
  });

  it('the record keeps the limits in the words the step screen showed them', async () => {
    const { id } = await walkToFinding();
    const record = parsed(DiagnosisRecord, (await suite.tech.get(`/api/diagnoses/${id}`).expect(200)).body);
    const withLimits = record.steps.filter((s) => s.kind === 'reading');
    expect(withLimits.length).toBe(2);
    for (const s of withLimits) {
      const shownOnPhone = stepView(benchDoc, benchDoc.steps.find((x) => x.id === s.stepId)!).limits?.text;
      // e.g. "100 – 200 Ω": the phone's limits line, not a wording of the server's own
      expect(s.shown.limitsText).toBe(shownOnPhone);
    }
  });

  it('a diagnosis taken over from the record walks on the phone to the verdicts and values the server stored', async () => {
    const { id } = await walkToFinding();
    const record = parsed(DiagnosisRecord, (await suite.tech.get(`/api/diagnoses/${id}`).expect(200)).body);
    const rows: LocalRow[] = [];
    for (const s of record.steps.filter((x) => !x.superseded)) {
      rows.push({ id: s.id, stepId: s.stepId, after: rows.at(-1)?.id ?? null, note: s.note, startedAt: s.startedAt, answeredAt: s.answeredAt, ...enteredOf(s) });
    }
    const { state } = walkRows(benchDoc, rows);
    expect(state.status).toBe('ended');
    for (const s of record.steps) {
      const p = state.path.find((x) => x.stepId === s.stepId)!;
      expect(p.decision?.verdict ?? null, s.stepId).toBe(s.verdict);
      if (s.value === null) expect(p.value, s.stepId).toBeUndefined();
      else expect(p.value, s.stepId).toBeCloseTo(s.value, 9);
    }
  });
});
