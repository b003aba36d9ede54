import { describe, expect, it } from 'vitest';
import { afterFor, formulaRows, pathRows, walkRows, withMeter } from '../../src/features/bench/lib/walk-rows';
import type { LocalRow } from '../../src/lib/offline/db';
import { noSpark } from '../../content/no-spark';

const T = '2026-12-02T00:00:00.000Z';
let n = 0;
const row = (stepId: string, after: string | null, extra: Partial<LocalRow> = {}): LocalRow => ({
  id: `row-${++n}`, stepId, after, note: '', startedAt: T, answeredAt: T, ...extra,
});

/** Answers rows one after another on the current path, as the step screen does. */
function answerAll(answers: [string, Partial<LocalRow>][]): LocalRow[] {
  let rows: LocalRow[] = [];
  for (const [stepId, extra] of answers) {
    const { path } = walkRows(noSpark, rows);
    rows = [...rows, row(stepId, afterFor(path, path.length), extra)];
    rows = [...rows, ...formulaRows(noSpark, rows, T)];
  }
  return rows;
}

const toCoilSecondary: [string, Partial<LocalRow>][] = [
  ['prepare', {}], ['sparkTest', { answerId: 'none', acknowledged: true }], ['isolateStop', {}],
  ['sparkRetest', { answerId: 'no', acknowledged: true }], ['capOhms', { entered: '4K7' }], ['groundCheck', { entered: '0,4' }],
  ['engineTemp', { entered: '21' }], ['coilPrimary', { entered: '0.5' }],
];

describe('walking a diagnosis from the rows kept on the phone', () => {
  it('reads 4K7 as 4.7 kΩ and 0,4 as 0.4 Ω (IEC 60062 code, decimal comma) and routes within limits', () => {
    const { state } = walkRows(noSpark, answerAll(toCoilSecondary));
    expect(state.problem).toBeNull();
    expect(state.values.capOhms?.value).toBe(4700);
    expect(state.values.groundCheck?.value).toBeCloseTo(0.4, 12);
    expect(state.current?.id).toBe('coilSecondary');
  });

  it('adds a row for a Formula the walker computed, chained after the reading that led to it', () => {
    const rows = answerAll([...toCoilSecondary, ['coilSecondary', { entered: '3.5k' }]]);
    const last = rows[rows.length - 1]!;
    expect(last.stepId).toBe('secondaryAt20');
    expect(last.after).toBe(rows[rows.length - 2]!.id);
    expect(walkRows(noSpark, rows).state.current?.id).toBe('exciterOhms');
  });

  it('2.1k at the exciter winding is above its limits and ends at the stator Finding', () => {
    const rows = answerAll([...toCoilSecondary, ['coilSecondary', { entered: '3.5k' }], ['exciterOhms', { entered: '2.1k' }]]);
    const { state } = walkRows(noSpark, rows);
    expect(state.status).toBe('ended');
    expect(state.ending?.id).toBe('statorFaulty');
    expect(state.path.find((p) => p.stepId === 'exciterOhms')?.decision?.verdict).toBe('above');
  });

  it('going back to an earlier step cuts the path there, and the later rows stay in the list', () => {
    const rows = answerAll(toCoilSecondary.slice(0, 3));
    const { path } = walkRows(noSpark, rows);
    const redo = row('sparkTest', afterFor(path, 1), { answerId: 'strong', acknowledged: true });
    const all = [...rows, redo];
    expect(pathRows(all).map((r) => r.stepId)).toEqual(['prepare', 'sparkTest']);
    expect(all).toHaveLength(4);
    expect(walkRows(noSpark, all).state.ending?.id).toBe('sparkGood');
  });

  it('the diagnosis meter fills in only the Readings that name no meter of their own', () => {
    const entries = [{ quantity: 'temperature', percentOfReading: 1, counts: 2, resolution: 0.1 }, { quantity: 'resistance', percentOfReading: 9, counts: 9, resolution: 9 }];
    const doc = withMeter(noSpark, entries);
    const temp = doc.steps.find((s) => s.id === 'engineTemp');
    const cap = doc.steps.find((s) => s.id === 'capOhms');
    expect(temp?.kind === 'reading' && temp.meter).toEqual({ percentOfReading: 1, counts: 2, resolution: 0.1 });
    expect(cap?.kind === 'reading' && cap.meter?.percentOfReading).not.toBe(9);
  });

  it('going on from the walk before a tap gives the same state as a replay from the start, one walker step per tap', () => {
    let rows: LocalRow[] = [];
    let walked = walkRows(noSpark, rows);
    for (const [stepId, extra] of [...toCoilSecondary, ['coilSecondary', { entered: '3.5k' }], ['exciterOhms', { entered: '2.1k' }]] as [string, Partial<LocalRow>][]) {
      const withAnswer = [...rows, row(stepId, afterFor(walked.path, walked.path.length), extra)];
      const onward = walkRows(noSpark, withAnswer, walked);
      rows = [...withAnswer, ...formulaRows(noSpark, withAnswer, T, onward)];
      const earlier = walked.walk.record[0];
      walked = walkRows(noSpark, rows, onward);
      const replay = walkRows(noSpark, rows);
      expect(walked.state).toEqual(replay.state);
      expect(walked.path).toEqual(replay.path);
      // Went on rather than replayed: the entries walked before are the very same records.
      if (earlier) expect(walked.walk.record[0]).toBe(earlier);
      expect(replay.walk.record[0]).not.toBe(walked.walk.record[0]);
    }
    expect(walked.state.ending?.id).toBe('statorFaulty');
  });

  it('a row that goes back on the path is walked by a replay, and the walk it went on from is left as it was', () => {
    const rows = answerAll(toCoilSecondary.slice(0, 3));
    const walked = walkRows(noSpark, rows);
    const current = walked.state.current?.id;
    const all = [...rows, row('sparkTest', afterFor(walked.path, 1), { answerId: 'strong', acknowledged: true })];
    expect(walkRows(noSpark, all, walked).state).toEqual(walkRows(noSpark, all).state);
    expect(walkRows(noSpark, all, walked).state.ending?.id).toBe('sparkGood');
    expect(walked.state.current?.id).toBe(current);
  });
});
