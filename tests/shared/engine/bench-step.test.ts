import { describe, expect, it } from 'vitest';
import type { ReadingStep, StepInput } from '@shared/schema';
import type { RecordStep } from '@shared/schema/bench';
import { recordedHandle } from '@shared/engine/kinds';
import { decideEntered } from '@shared/engine/reading-entry';
import { enteredOf, walkEntryOf } from '@shared/engine/step-entry';
import { remeasuredAt, walkProcedure } from '@shared/engine/walk';
import { doc, finding, observation, ohmsReading, task } from '../fixtures';

// The helpers around a Bench step that the phone and the server share (shared/engine/step-entry.ts,
// reading-entry.ts, walk.ts, schema/branches.ts). Limits are invented for the tests.

const d = doc([
  task('prep', 'look'),
  observation('look', { spark: 'f', none: 'temp' }),
  { id: 'temp', kind: 'reading', title: 'Engine temperature', quantity: 'temperature', unit: '°C', limits: { kind: 'range', max: 60 }, bands: [{ id: 'any', label: 'Any', next: 'coil' }] },
  { ...ohmsReading('coil', 0.1, 1, { low: 'f', ok: 'f', high: 'f' }), leadNull: true, winding: { material: 'copper', temperatureStep: 'temp' } } as StepInput,
  { ...ohmsReading('cap', 4000, 6000, { low: 'f', ok: 'f', high: 'f' }), meter: { percentOfReading: 2, counts: 5, resolution: 10 }, decision: 'guarded' } as StepInput,
  finding('f'),
]);
const step = (id: string) => d.steps.find((s) => s.id === id)!;

describe('what was entered at a step', () => {
  it('a Reading row becomes a reading entry with its test-lead reading, an Observation an answer, a Task a confirmation', () => {
    expect(walkEntryOf(step('coil'), { stepId: 'coil', entered: '0,7', leadEntered: '0.2', acknowledged: true }))
      .toEqual({ stepId: 'coil', acknowledged: true, answer: { kind: 'reading', text: '0,7', leadText: '0.2' } });
    expect(walkEntryOf(step('look'), { stepId: 'look', answerId: 'none' })).toEqual({ stepId: 'look', acknowledged: false, answer: { kind: 'observation', answerId: 'none' } });
    expect(walkEntryOf(step('prep'), { stepId: 'prep', entered: null, leadEntered: null })).toEqual({ stepId: 'prep', acknowledged: false, answer: { kind: 'task' } });
  });

  it('an ending or an unknown step needs no entry', () => {
    expect(walkEntryOf(step('f'), { stepId: 'f' })).toBeNull();
    expect(walkEntryOf(undefined, { stepId: 'gone' })).toBeNull();
  });

  it('a step of the record gives back what the phone sent: the typed reading only for Readings, the leads and the acknowledgement from what was shown', () => {
    const reading = { kind: 'reading', entered: '0,7', answerId: null, shown: { title: 'Coil', instructions: '', safety: [], leadEntered: '0.2', acknowledged: true } } satisfies Pick<RecordStep, 'kind' | 'entered' | 'answerId' | 'shown'>;
    expect(enteredOf(reading)).toEqual({ entered: '0,7', leadEntered: '0.2', acknowledged: true });
    // A Formula's stored `entered` is not something the technician typed.
    expect(enteredOf({ ...reading, kind: 'formula', shown: { title: 'F', instructions: '', safety: [] } })).toEqual({});
    expect(enteredOf({ kind: 'observation', entered: null, answerId: 'none', shown: { title: 'Look', instructions: '', safety: [] } })).toEqual({ answerId: 'none' });
  });
});

describe('the live verdict of a reading', () => {
  it('is the walker\'s decision: lead null and copper correction to 20 °C (IEC 60028 coefficient)', () => {
    const values = { temp: { value: 30, quantity: 'temperature' as const } };
    const r = decideEntered(step('coil') as ReadingStep, { text: '0.7', leadText: '0.2' }, values, 0);
    expect(r.ok).toBe(true);
    const walked = walkProcedure(d, [
      { stepId: 'prep', answer: { kind: 'task' } }, { stepId: 'look', answer: { kind: 'observation', answerId: 'none' } },
      { stepId: 'temp', answer: { kind: 'reading', text: '30' } }, { stepId: 'coil', answer: { kind: 'reading', text: '0.7', leadText: '0.2' } },
    ]);
    const coil = walked.path.find((p) => p.stepId === 'coil')!;
    expect(r.ok && r.decision.value).toBeCloseTo(coil.value!, 12);
    expect(r.ok && r.decision.value).toBeCloseTo(0.48109, 5); // (0.7 − 0.2) Ω at 30 °C, α20 = 0.00393 /K
  });

  it('gives no verdict when the engine temperature was not measured on the path, as the walker refuses the answer', () => {
    const r = decideEntered(step('coil') as ReadingStep, { text: '0.7' }, {}, 0);
    expect(r).toMatchObject({ ok: false, code: 'missing-value' });
    expect(!r.ok && r.reading?.value).toBeCloseTo(0.7, 12);
  });

  it('says which part was not understood: the reading, or the test leads', () => {
    expect(decideEntered(step('coil') as ReadingStep, { text: 'abc' }, {}, 0)).toMatchObject({ ok: false, code: 'bad-reading' });
    const lead = decideEntered(step('coil') as ReadingStep, { text: '0.7', leadText: 'x' }, { temp: { value: 20, quantity: 'temperature' } }, 0);
    expect(lead).toMatchObject({ ok: false, code: 'bad-reading' });
    expect(!lead.ok && lead.message).toMatch(/^Test leads: /);
  });
});

describe('re-measure counts and the branch a recorded step took', () => {
  it('counts only the borderline readings in a row at the end of the path', () => {
    const path = [
      { stepId: 'cap', outcome: 're-measure' as const }, { stepId: 'look', outcome: 'answered' as const },
      { stepId: 'cap', outcome: 're-measure' as const }, { stepId: 'cap', outcome: 're-measure' as const },
    ];
    expect(remeasuredAt(path, 'cap')).toBe(2);
    expect(remeasuredAt(path, 'look')).toBe(0);
    expect(remeasuredAt([], 'cap')).toBe(0);
  });

  it('names the handle the editor and the path figures use for the recorded band or answer', () => {
    expect(recordedHandle('ok', null)).toBe('band:ok');
    expect(recordedHandle('borderline', null)).toBe('borderline');
    expect(recordedHandle(null, 'none')).toBe('answer:none');
    expect(recordedHandle(null, null)).toBe('next');
  });
});
