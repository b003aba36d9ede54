import { describe, expect, it } from 'vitest';
import { filterProcedures } from '../../src/features/bench/lib/kit';
import type { BenchProcedure } from '@shared/schema/bench';

const p = (slug: string, title: string, symptom: string, ignitionSystem: string): BenchProcedure =>
  ({ procedureId: slug, slug, title, symptom, ignitionSystem, versionId: `${slug}-v1`, number: 1, publishedAt: null });
const list = [
  p('no-spark', 'No spark', 'No spark', 'magneto-cdi'),
  p('weak-spark', 'Weak spark', 'Weak or orange spark', 'magneto-cdi'),
  p('will-not-stop', 'Engine will not stop', 'Kill switch does not stop the engine', 'battery-cdi'),
];

describe('filtering the kept procedures on the phone, as the server filters them', () => {
  it('matches the words in the symptom or the title, whatever their case', () => {
    expect(filterProcedures(list, { symptom: 'SPARK', ignitionSystem: '' }).map((x) => x.slug)).toEqual(['no-spark', 'weak-spark']);
    expect(filterProcedures(list, { symptom: 'kill switch', ignitionSystem: '' }).map((x) => x.slug)).toEqual(['will-not-stop']);
    expect(filterProcedures(list, { symptom: 'will not', ignitionSystem: '' }).map((x) => x.slug)).toEqual(['will-not-stop']);
  });

  it('keeps only the chosen ignition system, and everything when nothing is chosen', () => {
    expect(filterProcedures(list, { symptom: '', ignitionSystem: 'battery-cdi' }).map((x) => x.slug)).toEqual(['will-not-stop']);
    expect(filterProcedures(list, { symptom: ' ', ignitionSystem: '' })).toHaveLength(3);
    expect(filterProcedures(list, { symptom: 'spark', ignitionSystem: 'battery-cdi' })).toEqual([]);
  });
});
