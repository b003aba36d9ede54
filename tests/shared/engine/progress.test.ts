import { describe, expect, it } from 'vitest';
import { branchesOf } from '@shared/engine/kinds';
import { branchJump, pathFigures, stepsToGo } from '@shared/engine';
import { DEMO_PROCEDURES } from '../../../content';
import { noSpark } from '../../../content/no-spark';

// The Bench progress line (issue 11 point 1): the steps still to go, from the path figures (an
// absorbing Markov chain, expected steps to absorption; Kemeny & Snell, Finite Markov Chains,
// ch. III, from memory), shown as a range over the current step's branches.

describe('steps to go on the Bench', () => {
  it('at the plug-cap reading of "No spark" the range spans the faulty-cap Finding and the long way on', () => {
    const f = pathFigures(noSpark);
    const range = stepsToGo(noSpark, f.perStep, 'capOhms')!;
    expect(range.low).toBe(1); // a faulty cap: its Finding is next (common practice: the cheap check first)
    expect(range.high).toBeGreaterThanOrEqual(3);
    expect(range.high).toBe(Math.round(f.perStep.groundCheck!.expectedSteps));
  });

  it('an ending has nothing to go', () => {
    expect(stepsToGo(noSpark, pathFigures(noSpark).perStep, 'statorFaulty')).toEqual({ low: 0, high: 0 });
  });

  it('after any answer of any demo step, the steps expected from there lie inside the range shown before it', () => {
    // The old line showed one rounded number, so "about 2 to go" could become "about 4 to go" after
    // one answer; a range over the branches always holds where the answer leads.
    for (const { document: doc } of DEMO_PROCEDURES) {
      const { perStep } = pathFigures(doc);
      for (const step of doc.steps) {
        const before = stepsToGo(doc, perStep, step.id);
        if (!before) continue;
        for (const b of branchesOf(step).filter((x) => x.kind !== 'borderline')) {
          const expected = Math.round(perStep[b.to]!.expectedSteps);
          expect(expected, `${doc.meta.title}: ${step.id} → ${b.to}`).toBeGreaterThanOrEqual(before.low);
          expect(expected, `${doc.meta.title}: ${step.id} → ${b.to}`).toBeLessThanOrEqual(before.high);
        }
      }
    }
  });

  it('a cap that reads fine leads to the longer branch; a faulty one to the shorter', () => {
    const { perStep } = pathFigures(noSpark);
    expect(branchJump(perStep, 'capOhms', 'groundCheck')).toBeGreaterThanOrEqual(1);
    expect(branchJump(perStep, 'capOhms', 'capFaulty')).toBeLessThanOrEqual(-1);
  });

  it('recorded branch frequencies move the estimate: a shop where caps are mostly faulty expects fewer steps', () => {
    const equal = pathFigures(noSpark).perStep.capOhms!.expectedSteps;
    const mostlyFaulty = pathFigures(noSpark, { branchCounts: { capOhms: { 'band:below': 40, 'band:above': 40, 'band:within': 2 } } }).perStep.capOhms!.expectedSteps;
    expect(mostlyFaulty).toBeLessThan(equal);
  });
});
