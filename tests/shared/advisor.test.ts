import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { findCheckChains, expectedChainSeconds, orderByRatio, adviseChain, reorderChain, type CheckEstimate } from '@shared/engine/advisor';
import { branchesOf } from '@shared/engine/kinds';
import { doc, finding, handoff, task, observation, ohmsReading } from './fixtures';

// Kadane & Simon, Annals of Statistics 5(2), 1977; Heckerman, Breese & Rommelse, CACM 38(3), 1995:
// for independent single-fault checks, decreasing p/c minimises the expected cost. Checked here
// against brute force over every order.
function permutations<T>(xs: readonly T[]): T[][] {
  if (xs.length <= 1) return [[...xs]];
  return xs.flatMap((x, i) => permutations([...xs.slice(0, i), ...xs.slice(i + 1)]).map((p) => [x, ...p]));
}

/** A chain of checks whose reveal shares add up to at most 1 (a single fault). */
const chainEstimates = fc.integer({ min: 2, max: 6 }).chain((n) =>
  fc.tuple(
    fc.array(fc.double({ min: 0.001, max: 1, noNaN: true }), { minLength: n + 1, maxLength: n + 1 }),
    fc.array(fc.integer({ min: 5, max: 900 }), { minLength: n, maxLength: n }),
  ).map(([weights, seconds]) => {
    const total = weights.reduce((a, b) => a + b, 0);
    return seconds.map((s, i): CheckEstimate => ({ stepId: `c${i}`, revealShare: weights[i]! / total, seconds: s }));
  }),
);

describe('the order of independent checks', () => {
  it('expected time counts each check only when no earlier check revealed the fault', () => {
    expect(expectedChainSeconds([{ stepId: 'a', revealShare: 0.5, seconds: 60 }, { stepId: 'b', revealShare: 0.2, seconds: 30 }])).toBe(75);
  });

  it('the p/c order is never slower than any other order of the same checks (brute force, up to 6 checks)', () => {
    fc.assert(fc.property(chainEstimates, (checks) => {
      const best = Math.min(...permutations(checks).map(expectedChainSeconds));
      expect(expectedChainSeconds(orderByRatio(checks))).toBeCloseTo(best, 9);
    }), { numRuns: 200 });
  });

  it('a likely and quick check moves ahead of an unlikely slow one and the saving is reported', () => {
    const advice = adviseChain({ checks: ['slow', 'quick'], tail: 't' }, [
      { stepId: 'slow', revealShare: 0.1, seconds: 600 },
      { stepId: 'quick', revealShare: 0.6, seconds: 60 },
    ]);
    expect(advice.proposed.map((c) => c.stepId)).toEqual(['quick', 'slow']);
    expect(advice.changes).toBe(true);
    expect(advice.currentSeconds).toBeCloseTo(600 + 0.9 * 60, 9);
    expect(advice.proposedSeconds).toBeCloseTo(60 + 0.4 * 600, 9);
  });

  it('equal ratios keep the current order so the advisor does not propose a change for nothing', () => {
    const checks = [{ stepId: 'a', revealShare: 0.2, seconds: 60 }, { stepId: 'b', revealShare: 0.4, seconds: 120 }];
    expect(adviseChain({ checks: ['a', 'b'], tail: 't' }, checks).changes).toBe(false);
  });
});

// start → plug (obs) → coil (reading) → kill (obs) → pulser (task) → …; each check also ends at a Finding.
const chainDoc = () => doc([
  task('start', 'plug'),
  observation('plug', { fouled: 'plugFault', clean: 'coil' }),
  ohmsReading('coil', 0.2, 1.0, { low: 'coilFault', ok: 'kill', high: 'coilFault' }),
  observation('kill', { shorted: 'killFault', open: 'pulser' }),
  task('pulser', 'senior'),
  finding('plugFault'), finding('coilFault'), finding('killFault'), handoff('senior'),
]);

describe('finding chains of checks in a procedure', () => {
  it('finds the run of checks that each end at a Finding or pass to the next', () => {
    expect(findCheckChains(chainDoc())).toEqual([{ checks: ['plug', 'coil', 'kill'], tail: 'pulser' }]);
  });

  it('a check reached from elsewhere too ends the chain before it, so reordering changes no other path', () => {
    const d = doc([
      observation('start', { yes: 'plug', no: 'kill' }),
      observation('plug', { fouled: 'plugFault', clean: 'coil' }),
      observation('coil', { bad: 'coilFault', good: 'kill' }),
      observation('kill', { shorted: 'killFault', open: 'senior' }),
      finding('plugFault'), finding('coilFault'), finding('killFault'), handoff('senior'),
    ]);
    expect(findCheckChains(d)).toEqual([{ checks: ['plug', 'coil'], tail: 'kill' }]);
  });

  it('a check whose other branch goes to a Hand-off rather than a Finding is not part of a chain', () => {
    const d = doc([
      observation('a', { bad: 'senior', good: 'b' }),
      observation('b', { bad: 'f', good: 'c' }),
      task('c', 'f'), finding('f'), handoff('senior'),
    ]);
    expect(findCheckChains(d)).toEqual([]);
  });

  it('reordering keeps every Finding branch and rewires the passes through the new order to the tail', () => {
    const d = chainDoc();
    const [chain] = findCheckChains(d);
    const out = reorderChain(d, chain!, ['kill', 'plug', 'coil']);
    const next = (id: string) => branchesOf(out.steps.find((s) => s.id === id)!).map((b) => `${b.handle}->${b.to}`);
    expect(next('start')).toEqual(['next->kill']);
    expect(next('kill')).toEqual(['answer:shorted->killFault', 'answer:open->plug']);
    expect(next('plug')).toEqual(['answer:fouled->plugFault', 'answer:clean->coil']);
    expect(next('coil')).toEqual(['band:low->coilFault', 'band:ok->pulser', 'band:high->coilFault']);
    expect(findCheckChains(out)).toEqual([{ checks: ['kill', 'plug', 'coil'], tail: 'pulser' }]);
  });

  it('when the chain starts the procedure, the start moves to the new first check', () => {
    const d = doc([
      observation('a', { bad: 'fa', good: 'b' }),
      observation('b', { bad: 'fb', good: 'h' }),
      finding('fa'), finding('fb'), handoff('h'),
    ]);
    const [chain] = findCheckChains(d);
    expect(reorderChain(d, chain!, ['b', 'a']).start).toBe('b');
  });

  it('an order that is not a permutation of the chain is refused', () => {
    const d = chainDoc();
    const [chain] = findCheckChains(d);
    expect(() => reorderChain(d, chain!, ['plug', 'coil'])).toThrow(/exactly the checks/);
  });
});
