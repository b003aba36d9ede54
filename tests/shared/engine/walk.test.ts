import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { walkProcedure, type WalkEntry } from '@shared/engine';
import { formatLimit, unitFactor } from '@shared/measure';
import type { ProcedureDocument, Step, StepInput } from '@shared/schema';
import { joinLinked } from '@shared/engine/link-join';
import { DEMO_PROCEDURES } from '../../../content';
import { doc, finding, observation, ohmsReading, task } from '../fixtures';
import { rng, soundProcedure } from '../generate';

const obs = (stepId: string, answerId: string, acknowledged = false): WalkEntry => ({ stepId, answer: { kind: 'observation', answerId }, acknowledged });
const read = (stepId: string, text: string, leadText?: string): WalkEntry => ({ stepId, answer: { kind: 'reading', text, ...(leadText ? { leadText } : {}) } });
const done = (stepId: string): WalkEntry => ({ stepId, answer: { kind: 'task' } });

const basic = () => doc([
  task('prep', 'look'),
  { ...observation('look', { spark: 'good', none: 'coil' }), safety: [{ signal: 'DANGER', text: 'HT lead: tens of kilovolts.' }] } as StepInput,
  ohmsReading('coil', 0.2, 1, { low: 'shorted', ok: 'good', high: 'open' }),
  finding('good'), finding('shorted'), finding('open'),
]);

describe('walkProcedure', () => {
  it('starts at the first step and shows what the technician must see', () => {
    const s = walkProcedure(basic(), []);
    expect(s.status).toBe('in-progress');
    expect(s.current?.id).toBe('prep');
  });

  it('refuses an answer at a DANGER step until the note is acknowledged', () => {
    const refused = walkProcedure(basic(), [done('prep'), obs('look', 'none')]);
    expect(refused.current?.id).toBe('look');
    expect(refused.current?.mustAcknowledge).toBe(true);
    expect(refused.problem?.code).toBe('not-acknowledged');
    expect(refused.record[1]!.status).toBe('rejected');
    expect(walkProcedure(basic(), [done('prep'), obs('look', 'none', true)]).current?.id).toBe('coil');
  });

  it('shows limits in the display unit of the step', () => {
    const s = walkProcedure(basic(), [done('prep'), obs('look', 'none', true)]);
    expect(s.current?.limits?.text).toBe('0.2 – 1 Ω');
  });

  it('routes a reading to its band and ends at the Finding', () => {
    const s = walkProcedure(basic(), [done('prep'), obs('look', 'none', true), read('coil', '0,05')]);
    expect(s.status).toBe('ended');
    expect(s.ending?.id).toBe('shorted');
    expect(s.path.map((p) => p.stepId)).toEqual(['prep', 'look', 'coil', 'shorted']);
    expect(s.path[2]!.decision?.verdict).toBe('below');
  });

  it('refuses a reading it cannot understand and says what to type, staying on the step', () => {
    const s = walkProcedure(basic(), [done('prep'), obs('look', 'none', true), read('coil', '1,200')]);
    expect(s.current?.id).toBe('coil');
    expect(s.problem?.code).toBe('bad-reading');
    expect(s.problem?.readingError?.suggestion).toMatch(/1200/);
  });

  it('going back to an earlier step keeps later answers in the record, marked superseded', () => {
    const log = [done('prep'), obs('look', 'none', true), read('coil', '0.5'), obs('look', 'spark', true)];
    const s = walkProcedure(basic(), log);
    expect(s.ending?.id).toBe('good');
    expect(s.path.map((p) => p.stepId)).toEqual(['prep', 'look', 'good']);
    expect(s.record.map((r) => r.status)).toEqual(['applied', 'superseded', 'superseded', 'applied']);
    expect(s.values).toEqual({});
  });

  it('refuses an answer for a step that is neither current nor on the path', () => {
    const s = walkProcedure(basic(), [read('coil', '0.5')]);
    expect(s.problem?.code).toBe('wrong-step');
    expect(s.current?.id).toBe('prep');
  });

  it('asks to re-measure a borderline reading once, then routes by the value', () => {
    const guarded = doc([{
      ...ohmsReading('r', 100, 200, { low: 'low', ok: 'ok', high: 'high' }), decision: 'guarded', meter: { percentOfReading: 0.9, counts: 2, resolution: 0.1 },
    } as StepInput, finding('low'), finding('ok'), finding('high')]);
    const first = walkProcedure(guarded, [read('r', '199.0')]);
    expect(first.current?.id).toBe('r');
    expect(first.remeasure).toBe(true);
    expect(first.path[0]!.decision?.zone).toBe('conditional-pass');
    const second = walkProcedure(guarded, [read('r', '199.0'), read('r', '199.2')]);
    expect(second.ending?.id).toBe('ok');
  });

  it('follows the author\'s borderline branch when the step has one', () => {
    const d = doc([{
      ...ohmsReading('r', 100, 200, { low: 'low', ok: 'ok', high: 'high' }), decision: 'guarded', meter: { percentOfReading: 0.9, counts: 2, resolution: 0.1 },
      borderline: { action: 'branch', next: 'senior' },
    } as StepInput, finding('low'), finding('ok'), finding('high'), finding('senior')]);
    expect(walkProcedure(d, [read('r', '201')]).ending?.id).toBe('senior');
  });

  it('computes Formula steps by itself, with test-lead null and copper correction on the way', () => {
    const d = doc([
      { id: 'temp', kind: 'reading', title: 'T', quantity: 'temperature', unit: '°C', limits: { kind: 'range', max: 60 }, bands: [{ id: 'a', label: 'A', next: 'coil' }] },
      { ...ohmsReading('coil', 0.1, 1, { low: 'f', ok: 'calc', high: 'f' }), leadNull: true, winding: { material: 'copper', temperatureStep: 'temp' } } as StepInput,
      { id: 'calc', kind: 'formula', title: 'Twice', expression: 'coil * 2', quantity: 'resistance', unit: 'Ω', next: 'done' },
      finding('f'), finding('done'),
    ]);
    const s = walkProcedure(d, [read('temp', '30'), read('coil', '0.7', '0.2')]);
    expect(s.status).toBe('ended');
    expect(s.values.coil!.value).toBeCloseTo(0.48109, 5); // (0.7 − 0.2) Ω at 30 °C → 20 °C, IEC 60028
    expect(s.values.calc!.value).toBeCloseTo(2 * s.values.coil!.value, 12);
    expect(s.path.find((p) => p.stepId === 'calc')!.entryIndex).toBeNull();
  });

  it('after the ending, an answer to an earlier step reopens the diagnosis from there', () => {
    const s = walkProcedure(basic(), [done('prep'), obs('look', 'spark', true), obs('look', 'none', true)]);
    expect(s.status).toBe('in-progress');
    expect(s.current?.id).toBe('coil');
  });
});

/** A value inside a band, typed as the technician would (in the step unit). */
function typedValueIn(step: Extract<Step, { kind: 'reading' }>, bandIndex: number): string {
  const b = step.bands[bandIndex % step.bands.length]!;
  const lo = b.lower?.value;
  const hi = b.upper?.value;
  let v: number;
  if (lo !== undefined && hi !== undefined) v = (lo + hi) / 2;
  else if (lo !== undefined) v = lo > 0 ? lo * 2 : lo + unitFactor(step.quantity, step.unit);
  else if (hi !== undefined) v = hi > 0 ? hi / 2 : hi - unitFactor(step.quantity, step.unit);
  else v = unitFactor(step.quantity, step.unit);
  return formatLimit(v, step.quantity, step.unit);
}

function randomWalk(d: ProcedureDocument, seed: number, maxEntries = 2000) {
  const random = rng(seed);
  const log: WalkEntry[] = [];
  let state = walkProcedure(d, log);
  const byId = new Map(d.steps.map((s) => [s.id, s]));
  while (state.status === 'in-progress' && log.length < maxEntries) {
    const step = byId.get(state.current!.id)!;
    const pick = Math.floor(random() * 8);
    const answer: WalkEntry['answer'] =
      step.kind === 'reading' ? { kind: 'reading', text: typedValueIn(step, pick) }
      : step.kind === 'observation' ? { kind: 'observation', answerId: step.answers[pick % step.answers.length]!.id }
      : { kind: 'task' };
    log.push({ stepId: step.id, answer, acknowledged: true });
    state = walkProcedure(d, log);
    expect(state.problem).toBeNull();
  }
  return state;
}

describe('random walks over sound procedures', () => {
  it('always reach an ending in the demo procedures, joined with the ones they continue in (property)', () => {
    const resolve = (slug: string) => {
      const d = DEMO_PROCEDURES.find((p) => p.slug === slug);
      return d && { slug, title: d.document.meta.title, versionId: slug, number: 1, document: d.document };
    };
    fc.assert(
      fc.property(fc.constantFrom(...DEMO_PROCEDURES), fc.integer(), (demo, seed) => {
        const s = randomWalk(joinLinked(demo.document, demo.slug, resolve).document, seed);
        expect(s.status).toBe('ended');
        expect(['finding', 'handoff']).toContain(s.ending?.kind);
      }),
      { numRuns: 150 },
    );
  });

  it('always reach an ending in generated procedures with loops (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 60 }), fc.integer({ min: 1, max: 1e6 }), fc.integer(), (n, docSeed, walkSeed) => {
        expect(randomWalk(soundProcedure(n, docSeed), walkSeed).status).toBe('ended');
      }),
      { numRuns: 60 },
    );
  });
});
