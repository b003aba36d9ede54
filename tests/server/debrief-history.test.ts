import { describe, it, expect } from 'vitest';
import { bandContains } from '@shared/measure/bands';
import { branchesOf } from '@shared/engine/kinds';
import { planWalks, rng, valueInBand, walkTowardsFault } from '../../server/seeders/history-walk';
import { scheduleVisits } from '../../server/seeders/history';
import { fixtureDoc } from './debrief.fixture';
import { doc as buildDoc, finding, observation } from '../shared/fixtures';

// The demo history generator (invented data): its walks must be walks the procedure allows.
describe('the demo history walker', () => {
  const plan = planWalks(fixtureDoc());

  it('the stated fault shares add up to 1, with 8 % for the Hand-off', () => {
    expect(plan.endings.reduce((a, e) => a + e.share, 0)).toBeCloseTo(1, 12);
    expect(plan.endings.find((e) => e.id === 'senior')!.share).toBeCloseTo(0.08, 12);
  });

  it('every walk follows branches of the procedure and ends at a Finding or Hand-off', () => {
    const rand = rng(3);
    const byId = new Map(fixtureDoc().steps.map((s) => [s.id, s]));
    for (let i = 0; i < 300; i++) {
      const walk = walkTowardsFault(plan, { rand, speed: 1, bias: 1, takeBackChance: 0.2 });
      const path = walk.steps.filter((s) => !s.superseded);
      expect(path[0]!.stepId).toBe('prepare');
      path.forEach((s, k) => {
        const next = path[k + 1]?.stepId ?? walk.endingStepId;
        // a borderline reading measured again stays at its step
        const remeasured = s.decided.next === s.stepId && s.decided.verdict?.startsWith('borderline');
        if (!remeasured) expect(branchesOf(byId.get(s.stepId)!).map((b) => b.to)).toContain(next);
        expect(s.decided.next).toBe(next);
      });
      expect(walk.end?.stepId).toBe(walk.endingStepId);
      expect(['finding', 'handoff']).toContain(byId.get(walk.endingStepId)!.kind);
    }
  });

  it('in a procedure with a loop every step knows every ending it can still reach', () => {
    const looped = planWalks(buildDoc([
      observation('a', { again: 'b', done: 'f1' }),
      observation('b', { back: 'a', stop: 'f2' }),
      finding('f1'), finding('f2'),
    ]));
    expect([...looped.reaches.get('a')!].sort()).toEqual(['f1', 'f2']);
    expect([...looped.reaches.get('b')!].sort()).toEqual(['f1', 'f2']);
  });

  it('a reading value lies in the band its branch names', () => {
    const rand = rng(9);
    const band = { lower: { value: 0.2, inclusive: true }, upper: { value: 1.0, inclusive: true } };
    const low = { upper: { value: 0.2, inclusive: false } };
    for (let i = 0; i < 500; i++) {
      expect(bandContains({ id: 'ok', ...band }, valueInBand(band, { min: 0.2, max: 1 }, rand))).toBe(true);
      const v = valueInBand(low, { min: 0.2, max: 1 }, rand);
      expect(v).toBeLessThan(0.2);
      expect(v).toBeGreaterThanOrEqual(0);
    }
  });

  it('visits of one vehicle are weeks apart unless it came back within three weeks', () => {
    const day = 86_400_000;
    const now = Date.parse('2026-12-01T00:00:00Z');
    const visits = scheduleVisits(2000, ['a', 'b', 'c', 'd', 'e', 'f', 'g', 'h', 'i', 'j'].map((x) => x.repeat(3)).concat(Array.from({ length: 700 }, (_, i) => `v${i}`)), 365, now, rng(1));
    expect(visits).toHaveLength(2000);
    const byVehicle = new Map<string, number[]>();
    for (const v of visits) byVehicle.set(v.vehicleId, [...(byVehicle.get(v.vehicleId) ?? []), v.at]);
    const gaps = [...byVehicle.values()].flatMap((ts) => ts.sort((a, b) => a - b).slice(1).map((t, i) => (t - ts[i]!) / day));
    expect(gaps.every((g) => g < 22 || g >= 45)).toBe(true);
    const comebacks = gaps.filter((g) => g < 22).length / gaps.length;
    expect(comebacks).toBeGreaterThan(0.03);
    expect(comebacks).toBeLessThan(0.2);
    expect(visits.every((v) => v.at < now)).toBe(true);
  });
});
