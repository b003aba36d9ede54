import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { buildGraph, pathFigures, stepMinutes } from '@shared/engine';
import type { ProcedureDocument, StepInput } from '@shared/schema';
import { doc, finding, observation, task } from '../fixtures';
import { randomGraph, soundProcedure } from '../generate';

/**
 * Oracle: plain value iteration t ← cost + P·t from zero, written independently of the engine's
 * component-wise solver. Absorbing Markov chains (Kemeny & Snell, "Finite Markov Chains", 1960).
 */
function valueIteration(d: ProcedureDocument, cost: (s: (typeof d.steps)[number]) => number): Map<string, number> {
  const g = buildGraph(d);
  let t = new Float64Array(g.size);
  for (let sweep = 0; sweep < 20_000; sweep++) {
    const next = new Float64Array(g.size);
    let change = 0;
    for (let v = 0; v < g.size; v++) {
      const deg = g.outStart[v + 1]! - g.outStart[v]!;
      let sum = cost(g.steps[v]!);
      for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) sum += t[g.targets[e]!]! / deg;
      next[v] = sum;
      change = Math.max(change, Math.abs(sum - t[v]!));
    }
    t = next;
    if (change < 1e-12) break;
  }
  return new Map(g.steps.map((s, v) => [s.id, t[v]!]));
}

describe('pathFigures', () => {
  it('on a straight line, shortest, longest and expected all equal the step count', () => {
    const f = pathFigures(doc([task('a', 'b'), task('b', 'c'), task('c', 'f'), finding('f')]));
    expect(f.shortest).toEqual({ steps: 4, minutes: 6 });
    expect(f.longest).toEqual({ steps: 4, minutes: 6 });
    expect(f.expected).toEqual({ steps: 4, minutes: 6 });
    expect(f.hasLoops).toBe(false);
  });

  it('uses step estimates, the default minutes per step, and no time for Formulas and endings', () => {
    const d = doc([{ ...task('a', 'f'), minutes: 7 } as StepInput, finding('f')]);
    expect(stepMinutes(d.steps[0]!, 2)).toBe(7);
    expect(stepMinutes(d.steps[1]!, 2)).toBe(0);
    expect(pathFigures(d).shortest).toEqual({ steps: 2, minutes: 7 });
  });

  it('a retry loop taken half the time gives 3 expected steps from the question (geometric series)', () => {
    // t = 1 + ½·t + ½·1 ⇒ t = 3 steps from the question, the Finding included.
    const f = pathFigures(doc([observation('look', { again: 'look', done: 'f' }), finding('f')]));
    expect(f.perStep.look!.expectedSteps).toBeCloseTo(3, 12);
    expect(f.hasLoops).toBe(true);
  });

  it('solves a large loop iteratively to the same answer (a ring of 40 questions, each ending half the time)', () => {
    const ring = Array.from({ length: 40 }, (_, i) => observation(`q${i}`, { on: `q${(i + 1) % 40}`, stop: 'f' }));
    const f = pathFigures(doc([...ring, finding('f')]));
    for (let i = 0; i < 40; i++) expect(f.perStep[`q${i}`]!.expectedSteps).toBeCloseTo(3, 8);
    expect(f.converged).toBe(true);
  });

  it('weights branches by recorded counts (with one added to each)', () => {
    const d = doc([observation('look', { a: 'long', b: 'f' }), task('long', 'long2'), task('long2', 'f'), finding('f')]);
    expect(pathFigures(d).expected!.steps).toBeCloseTo(1 + 0.5 * 3 + 0.5 * 1, 12);
    const counted = pathFigures(d, { branchCounts: { look: { 'answer:a': 8, 'answer:b': 0 } } });
    expect(counted.expected!.steps).toBeCloseTo(1 + 0.9 * 3 + 0.1 * 1, 12);
  });

  it('reports no expected figure when an ending may never be reached', () => {
    const f = pathFigures(doc([observation('a', { ok: 'f', trap: 'loop' }), task('loop', 'loop'), finding('f')]));
    expect(f.expected).toBeNull();
    expect(f.perStep.loop!.expectedSteps).toBe(Infinity);
    expect(f.shortest!.steps).toBe(2);
  });

  it('the longest path does not go round loops', () => {
    const f = pathFigures(doc([task('a', 'b'), observation('b', { back: 'a', on: 'c' }), task('c', 'f'), finding('f')]));
    expect(f.longest!.steps).toBe(4);
  });

  it('agrees with plain value iteration on generated procedures (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 120 }), fc.integer({ min: 1, max: 1e6 }), (n, seed) => {
        const d = soundProcedure(n, seed);
        const f = pathFigures(d);
        const oracle = valueIteration(d, () => 1);
        for (const [id, t] of oracle) expect(f.perStep[id]!.expectedSteps).toBeCloseTo(t, 6);
      }),
      { numRuns: 40 },
    );
  });

  it('shortest path in steps matches breadth-first search on random graphs', () => {
    for (let seed = 1; seed <= 30; seed++) {
      const d = randomGraph(25, 40, seed);
      const g = buildGraph(d);
      const dist = new Map<number, number>([[g.start, 1]]);
      const queue = [g.start];
      let best: number | null = null;
      while (queue.length) {
        const v = queue.shift()!;
        if (g.ending[v]) {
          best = dist.get(v)!;
          break;
        }
        for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) {
          const w = g.targets[e]!;
          if (!dist.has(w)) {
            dist.set(w, dist.get(v)! + 1);
            queue.push(w);
          }
        }
      }
      expect(pathFigures(d).shortest?.steps ?? null).toBe(best);
    }
  });
});
