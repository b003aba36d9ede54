import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { lintProcedure, type LintCode } from '@shared/engine';
import type { StepInput } from '@shared/schema';
import { doc, finding, handoff, observation, ohmsReading, task } from '../fixtures';
import { soundProcedure } from '../generate';

const codes = (steps: StepInput[], start?: string) => lintProcedure(doc(steps, start)).findings.map((f) => f.code);
const formula = (id: string, expression: string, next: string, extra: Partial<StepInput> = {}): StepInput =>
  ({ id, kind: 'formula', title: `Formula ${id}`, expression, quantity: 'resistance', unit: 'Ω', next, ...extra }) as StepInput;
const temperature = (id: string, next: string): StepInput => ({
  id, kind: 'reading', title: 'Temperature', quantity: 'temperature', unit: '°C', limits: { kind: 'range', max: 40 },
  bands: [{ id: 'all', label: 'Any', next }],
});

describe('lintProcedure on sound procedures', () => {
  it('finds nothing wrong with a small sound procedure', () => {
    const r = lintProcedure(doc([task('a', 'r'), ohmsReading('r', 1, 2, { low: 'f1', ok: 'f2', high: 'f1' }), finding('f1'), finding('f2')]));
    expect(r.findings).toEqual([]);
    expect(r.ok).toBe(true);
  });

  it('finds no errors in generated sound procedures with loops (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 300 }), fc.integer({ min: 1, max: 1e6 }), (n, seed) => {
        const r = lintProcedure(soundProcedure(n, seed));
        expect(r.findings.filter((f) => f.severity === 'error')).toEqual([]);
      }),
      { numRuns: 60 },
    );
  });
});

describe('lintProcedure structure errors', () => {
  it('reports duplicate ids', () => {
    expect(codes([task('a', 'f'), finding('f'), finding('f')])).toContain('duplicate-id');
  });

  it('reports a start step that does not exist', () => {
    expect(codes([finding('f')], 'nowhere')).toContain('start-missing');
  });

  it('reports a dangling branch with both step ids', () => {
    const r = lintProcedure(doc([task('a', 'ghost')]));
    const f = r.findings.find((x) => x.code === 'dangling-branch')!;
    expect(f.steps).toEqual(['a', 'ghost']);
    expect(f.message).toMatch(/does not exist/);
  });

  it('reports a dead end that is not a Finding or a Hand-off', () => {
    expect(codes([task('a', 'b'), task('b')])).toContain('dead-end');
  });

  it('reports unreachable steps', () => {
    expect(codes([task('a', 'f'), finding('f'), finding('lost')])).toContain('unreachable-step');
  });

  it('reports a loop without a way out, naming every step in it', () => {
    const r = lintProcedure(doc([task('a', 'b'), task('b', 'c'), task('c', 'b'), finding('f')]));
    const loop = r.findings.find((x) => x.code === 'loop-without-exit')!;
    expect([...loop.steps].sort()).toEqual(['b', 'c']);
    expect(r.findings.map((x) => x.code)).toContain('no-ending-reachable'); // 'a' leads only into the loop
  });

  it('accepts a loop with a way out (re-measure after cleaning)', () => {
    expect(codes([observation('look', { again: 'clean', done: 'f' }), task('clean', 'look'), finding('f')])).toEqual([]);
  });

  it('reports repeated band or answer ids in one step', () => {
    expect(codes([observation('o', { x: 'f' }), finding('f')])).toContain('single-answer');
    const dup: StepInput = { id: 'o', kind: 'observation', title: 'O', question: 'q', answers: [{ id: 'x', label: 'X', next: 'f' }, { id: 'x', label: 'Y', next: 'f' }] };
    expect(codes([dup, finding('f')])).toContain('duplicate-handle');
  });
});

describe('lintProcedure limits and bands', () => {
  it('reports a Reading without limits', () => {
    const r: StepInput = { id: 'r', kind: 'reading', title: 'R', quantity: 'resistance', unit: 'Ω', bands: [{ id: 'all', label: 'All', next: 'f' }] };
    expect(codes([r, finding('f')])).toContain('missing-limits');
  });

  it('reports a minimum above the maximum', () => {
    expect(codes([ohmsReading('r', 5, 1, { low: 'f', ok: 'f', high: 'f' }), finding('f')])).toContain('limits-invalid');
  });

  it('reports a gap between bands in the step unit, saying which values have nowhere to go', () => {
    const r: StepInput = {
      id: 'r', kind: 'reading', title: 'Gap', quantity: 'resistance', unit: 'kΩ', limits: { kind: 'range', min: 1000, max: 2000 },
      bands: [{ id: 'a', label: 'A', upper: { value: 1000, inclusive: true }, next: 'f' }, { id: 'b', label: 'B', lower: { value: 2000, inclusive: true }, next: 'f' }],
    };
    const f = lintProcedure(doc([r, finding('f')])).findings.find((x) => x.code === 'band-gap')!;
    expect(f.message).toContain('1 kΩ (excluded)');
    expect(f.message).toContain('2 kΩ (excluded)');
  });

  it('reports overlapping bands', () => {
    const r: StepInput = {
      id: 'r', kind: 'reading', title: 'Overlap', quantity: 'resistance', unit: 'Ω', limits: { kind: 'range', min: 1, max: 2 },
      bands: [{ id: 'a', label: 'A', upper: { value: 2, inclusive: true }, next: 'f' }, { id: 'b', label: 'B', lower: { value: 1, inclusive: true }, next: 'f' }],
    };
    expect(codes([r, finding('f')])).toContain('band-overlap');
  });
});

describe('lintProcedure formulas: definite measurement over joins and loops', () => {
  it('accepts a formula whose readings are measured on every path', () => {
    expect(codes([
      ohmsReading('a', 1, 2, { low: 'b', ok: 'b', high: 'b' }), ohmsReading('b', 1, 2, { low: 'x', ok: 'y', high: 'y' }),
      task('x', 'calc'), task('y', 'calc'), formula('calc', 'parallel(a, b)', 'f'), finding('f'),
    ])).toEqual([]);
  });

  it('reports a formula reached by a path that skipped one of its readings (join)', () => {
    const r = lintProcedure(doc([
      observation('start', { measure: 'a', skip: 'calc' }), ohmsReading('a', 1, 2, { low: 'calc', ok: 'calc', high: 'calc' }),
      formula('calc', 'a * 2', 'f'), finding('f'),
    ]));
    const f = r.findings.find((x) => x.code === 'formula-unmeasured')!;
    expect(f.steps).toEqual(['calc', 'a']);
  });

  it('reports a formula in a loop that reads a value measured only later in the loop', () => {
    expect(codes([
      task('start', 'calc'), formula('calc', 'later * 2', 'later'),
      ohmsReading('later', 1, 2, { low: 'calc', ok: 'f', high: 'f' }), finding('f'),
    ])).toContain('formula-unmeasured');
  });

  it('accepts a formula in a loop whose reading comes before the loop', () => {
    expect(codes([
      ohmsReading('first', 1, 2, { low: 'calc', ok: 'calc', high: 'calc' }), formula('calc', 'first * 2', 'again'),
      observation('again', { retry: 'calc', stop: 'f' }), finding('f'),
    ])).toEqual([]);
  });

  it('reports a formula that reads a step that is not a Reading or Formula', () => {
    expect(codes([task('t', 'calc'), formula('calc', 't * 2', 'f'), finding('f')])).toContain('formula-unknown-step');
  });

  it('reports a formula that does not parse, with the position', () => {
    const f = lintProcedure(doc([ohmsReading('a', 1, 2, { low: 'c', ok: 'c', high: 'c' }), formula('c', 'a +', 'f'), finding('f')])).findings[0]!;
    expect(f.code).toBe('formula-invalid');
    expect(f.message).toMatch(/character 4/);
  });

  it('reports a formula whose units do not give the step quantity', () => {
    expect(codes([ohmsReading('a', 1, 2, { low: 'c', ok: 'c', high: 'c' }), formula('c', 'a * a', 'f'), finding('f')])).toContain('formula-units');
  });

  it('reports a copper correction whose temperature is not measured on every path', () => {
    const hot = ohmsReading('coil', 0.1, 1, { low: 'f', ok: 'f', high: 'f' });
    const corrected = { ...hot, winding: { material: 'copper', temperatureStep: 'temp' } } as StepInput;
    expect(codes([observation('s', { t: 'temp', skip: 'coil' }), temperature('temp', 'coil'), corrected, finding('f')])).toContain('winding-unmeasured');
    expect(codes([temperature('temp', 'coil'), corrected, finding('f')])).toEqual([]);
  });
});

describe('lintProcedure safety and style', () => {
  it('reports a hazardous step without a DANGER, WARNING or CAUTION note', () => {
    const risky: StepInput = { id: 'a', kind: 'task', title: 'Crank', next: 'f', hazards: ['high-voltage'], safety: [{ signal: 'NOTICE', text: 'Service data first' }] };
    expect(codes([risky, finding('f')])).toContain('hazard-without-caution');
    const safe = { ...risky, safety: [{ signal: 'DANGER', text: 'HT lead carries tens of kV' }] } as StepInput;
    expect(codes([safe, finding('f')])).toEqual([]);
  });

  it('warns about a Finding without a repair and a very long path', () => {
    const chain = Array.from({ length: 45 }, (_, i) => task(`t${i}`, i === 44 ? 'f' : `t${i + 1}`));
    const r = lintProcedure(doc([...chain, finding('f', '')]));
    const warnings = r.findings.filter((f) => f.severity === 'warning').map((f) => f.code);
    expect(warnings.sort()).toEqual<LintCode[]>(['finding-without-repair', 'long-path']);
    expect(r.ok).toBe(true);
  });

  it('warns about guarded acceptance without a meter spec', () => {
    const r = { ...ohmsReading('r', 1, 2, { low: 'f', ok: 'f', high: 'f' }), decision: 'guarded' } as StepInput;
    expect(codes([r, finding('f')])).toEqual(['meter-missing']);
  });

  it('lists errors before warnings, each with a stable code, severity, steps and a sentence', () => {
    const r = lintProcedure(doc([task('a', 'ghost'), finding('f', ''), handoff('h')]));
    expect(r.findings[0]!.severity).toBe('error');
    expect(r.findings.at(-1)!.severity).toBe('warning');
    for (const f of r.findings) {
      expect(f.steps.length).toBeGreaterThan(0);
      expect(f.message).toMatch(/^[A-Z"].*\.$/);
    }
  });
});
